namespace LineTest.Core.Stability;

/// <summary>Inverse of a small dense matrix by Gauss–Jordan elimination with partial pivoting (for the fits' normal equations).</summary>
internal static class SmallMatrix
{
    /// <summary>Inverts the square matrix <paramref name="a"/> (left unchanged); false when it is numerically singular.</summary>
    public static bool TryInvert(double[,] a, out double[,] inverse)
    {
        var n = a.GetLength(0);
        var w = (double[,])a.Clone();
        inverse = new double[n, n];
        var scale = 0.0;
        for (var i = 0; i < n; i++)
        {
            inverse[i, i] = 1;
            scale = Math.Max(scale, Math.Abs(a[i, i]));
        }

        for (var col = 0; col < n; col++)
        {
            var pivot = col;
            for (var row = col + 1; row < n; row++)
            {
                if (Math.Abs(w[row, col]) > Math.Abs(w[pivot, col]))
                {
                    pivot = row;
                }
            }

            if (!(Math.Abs(w[pivot, col]) > 1e-14 * scale) || !double.IsFinite(w[pivot, col]))
            {
                return false;
            }

            if (pivot != col)
            {
                for (var k = 0; k < n; k++)
                {
                    (w[col, k], w[pivot, k]) = (w[pivot, k], w[col, k]);
                    (inverse[col, k], inverse[pivot, k]) = (inverse[pivot, k], inverse[col, k]);
                }
            }

            var p = w[col, col];
            for (var k = 0; k < n; k++)
            {
                w[col, k] /= p;
                inverse[col, k] /= p;
            }

            for (var row = 0; row < n; row++)
            {
                if (row == col || w[row, col] == 0)
                {
                    continue;
                }

                var factor = w[row, col];
                for (var k = 0; k < n; k++)
                {
                    w[row, k] -= factor * w[col, k];
                    inverse[row, k] -= factor * inverse[col, k];
                }
            }
        }

        return true;
    }
}
