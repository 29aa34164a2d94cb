using CsCheck;
using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class MonotonicInverseTests
{
    [Fact]
    public void Solve_CubeRoot_MatchesMathCbrt()
    {
        // Independent reference: Math.Cbrt. A poor guess at the far end of the bracket must still converge.
        Gen.Double[0.0, 1000.0].Sample(target =>
        {
            var root = MonotonicInverse.Solve(x => x * x * x, x => 3 * x * x, target, 0.0, 10.0, guess: 10.0);
            Assert.Equal(Math.Cbrt(target), root, 1e-9);
        }, iter: 500);
    }

    [Fact]
    public void Solve_FlatSlopeAtRoot_FallsBackToBisectionAndConverges()
    {
        // x³ has zero slope at 0: Newton alone creeps, the bracket keeps it honest.
        var root = MonotonicInverse.Solve(x => x * x * x, x => 3 * x * x, 0.0, -1.0, 2.0, guess: 0.0);

        Assert.Equal(0.0, root, 1e-4);
    }

    [Fact]
    public void Solve_SlopeReportsZero_StillConvergesByBisection()
    {
        var root = MonotonicInverse.Solve(x => (2 * x) + 1, _ => 0.0, 4.0, -10.0, 10.0, guess: double.NaN);

        Assert.Equal(1.5, root, 1e-9);
    }
}
