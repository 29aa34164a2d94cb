using System.Diagnostics;

namespace LineTest.Core.Thermometry;

/// <summary>
/// Inverts a strictly increasing function on a bracket by Newton's method, falling back to bisection
/// whenever a Newton step would leave the bracket, so it always converges where a root exists.
/// </summary>
internal static class MonotonicInverse
{
    private const int MaxIterations = 300;

    /// <summary>
    /// Solves <paramref name="function"/>(t) = <paramref name="target"/> for t in [<paramref name="low"/>, <paramref name="high"/>].
    /// The caller guarantees function(low) ≤ target ≤ function(high).
    /// </summary>
    public static double Solve(
        Func<double, double> function,
        Func<double, double> slope,
        double target,
        double low,
        double high,
        double guess)
    {
        Debug.Assert(low < high, "The bracket must be ordered.");
        var t = double.IsFinite(guess) ? Math.Clamp(guess, low, high) : 0.5 * (low + high);
        for (var i = 0; i < MaxIterations; i++)
        {
            var residual = function(t) - target;
            if (residual == 0)
            {
                return t;
            }

            if (residual > 0)
            {
                high = t;
            }
            else
            {
                low = t;
            }

            var derivative = slope(t);
            var next = derivative > 0 ? t - (residual / derivative) : double.NaN;

            // The negated comparison also catches NaN from a zero or non-finite slope.
            if (!(next > low && next < high))
            {
                next = 0.5 * (low + high);
            }

            // 1e-12 °C is far below any thermometer's resolution and well above double rounding at 1372 °C.
            if (Math.Abs(next - t) <= 1e-12 * Math.Max(1.0, Math.Abs(t)) || high - low <= 1e-12)
            {
                return next;
            }

            t = next;
        }

        return t;
    }
}
