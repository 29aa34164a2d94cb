using LineTest.Core.Stability;

namespace LineTest.Core.Tests.Stability;

public sealed class TimeConstantSearchTests
{
    [Fact]
    public void BestGridPointThenRefine_BowlInLogTau_FindsItsBottom()
    {
        // [derived] f(τ) = (ln τ − ln 37)² has its only minimum at τ = 37 s; the grid over 1 … 1000 s brackets it and the
        // golden-section search narrows the bracket to the tolerance.
        static double Bowl(double tau) => Math.Pow(Math.Log(tau) - Math.Log(37), 2);
        double low = Math.Log(1), high = Math.Log(1000);

        var best = TimeConstantSearch.BestGridPoint(Bowl, low, high);
        var tau = Math.Exp(TimeConstantSearch.Refine(Bowl, low, high, best, iterations: 80, tolerance: 1e-12));

        Assert.InRange(best, 1, TimeConstantSearch.GridPoints - 2);
        Assert.Equal(37, tau, 6);
    }

    [Fact]
    public void BestGridPoint_NoFiniteValue_IsMinusOne()
    {
        Assert.Equal(-1, TimeConstantSearch.BestGridPoint(_ => double.NaN, 0, 5));
    }

    [Fact]
    public void BestGridPoint_MinimumBeyondTheRange_IsTheEdge()
    {
        // Decreasing all the way: the best point is the longest τ searched, which the fits read as "too early".
        Assert.Equal(TimeConstantSearch.GridPoints - 1, TimeConstantSearch.BestGridPoint(tau => 1 / tau, 0, 5));
    }
}
