using LineTest.Core.Stability;
using MathNet.Numerics.LinearAlgebra;

namespace LineTest.Core.Tests.Stability;

public sealed class SmallMatrixTests
{
    [Fact]
    public void TryInvert_AgreesWithMathNet()
    {
        // [reference library] MathNet.Numerics dense inverse (LU) of a 4×4 normal-equations matrix with columns of very
        // different size, as the follower fit builds it.
        var rows = new[,] { { 30, 12.5, 410, -0.02 }, { 12.5, 7.1, 160, -0.011 }, { 410, 160, 6400, -0.3 }, { -0.02, -0.011, -0.3, 2.1e-5 } };

        Assert.True(SmallMatrix.TryInvert(rows, out var inverse));

        var expected = Matrix<double>.Build.DenseOfArray(rows).Inverse();
        for (var r = 0; r < 4; r++)
        {
            for (var c = 0; c < 4; c++)
            {
                Assert.Equal(expected[r, c], inverse[r, c], Math.Abs(expected[r, c]) * 1e-8 + 1e-12);
            }
        }
    }

    [Fact]
    public void TryInvert_SingularMatrix_ReturnsFalse()
    {
        Assert.False(SmallMatrix.TryInvert(new double[,] { { 1, 2 }, { 2, 4 } }, out _));
    }
}
