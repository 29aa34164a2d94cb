using CsCheck;
using LineTest.Core.Results;
using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class YieldAnalysisTests
{
    private static readonly DateTimeOffset T0 = new(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);

    private static RunOutcome Run(string serial, int minute, Verdict verdict, string? failure = null, string? error = null) =>
        new(serial, T0.AddMinutes(minute), verdict, failure, error);

    // Hand-made list, given out of time order on purpose [hand-computed expectations]:
    // A: pass                              → first pass, final pass
    // B: fail(offset_25C) then pass        → retest, final pass
    // C: error(source not stable) then pass → error is not a pass: not first pass, final pass
    // D: fail(gain_check) then fail(gain_check) → final fail
    // E: pass then fail(offset_25C)        → first pass, final fail
    private static readonly RunOutcome[] Runs =
    [
        Run("B", 12, Verdict.Pass),
        Run("A", 1, Verdict.Pass),
        Run("B", 2, Verdict.Fail, failure: "offset_25C"),
        Run("C", 3, Verdict.Error, error: "source not stable"),
        Run("D", 4, Verdict.Fail, failure: "gain_check"),
        Run("C", 13, Verdict.Pass),
        Run("E", 5, Verdict.Pass),
        Run("D", 14, Verdict.Fail, failure: "gain_check"),
        Run("E", 15, Verdict.Fail, failure: "offset_25C"),
    ];

    [Fact]
    public void Summarize_HandMadeRuns_CountsUnitsAndRuns()
    {
        var y = YieldAnalysis.Summarize(Runs);
        Assert.Equal(9, y.Runs);
        Assert.Equal(5, y.Units);
        Assert.Equal(4, y.PassRuns);
        Assert.Equal(4, y.FailRuns);
        Assert.Equal(1, y.ErrorRuns);
    }

    [Fact]
    public void Summarize_HandMadeRuns_FirstPassAndFinalYield()
    {
        var y = YieldAnalysis.Summarize(Runs);
        Assert.Equal(2, y.UnitsPassedFirstRun); // A, E
        Assert.Equal(3, y.UnitsPassedLastRun); // A, B, C
        Assert.Equal(0.4, y.FirstPassYield!.Value, 1e-15);
        Assert.Equal(0.6, y.FinalYield!.Value, 1e-15);
    }

    [Fact]
    public void Summarize_HandMadeRuns_RetestAndErrorRates()
    {
        var y = YieldAnalysis.Summarize(Runs);
        Assert.Equal(0.8, y.RetestRate!.Value, 1e-15); // (9 − 5)/5
        Assert.Equal(1.0 / 9, y.ErrorRate!.Value, 1e-15);
    }

    [Fact]
    public void Summarize_HandMadeRuns_ParetoSortedByCountThenName()
    {
        var y = YieldAnalysis.Summarize(Runs);
        Assert.Equal(
            [new ParetoEntry("gain_check", 2, 0.5, 0.5), new ParetoEntry("offset_25C", 2, 0.5, 1.0)],
            y.FailurePareto);
        Assert.Equal([new ParetoEntry("source not stable", 1, 1.0, 1.0)], y.ErrorReasons);
    }

    [Fact]
    public void Summarize_ErrorOnlyUnit_NeverCountedAsPass()
    {
        var y = YieldAnalysis.Summarize([Run("X", 0, Verdict.Error), Run("X", 1, Verdict.Error, error: " ")]);
        Assert.Equal(0.0, y.FirstPassYield);
        Assert.Equal(0.0, y.FinalYield);
        Assert.Equal([new ParetoEntry(YieldAnalysis.UnspecifiedError, 2, 1.0, 1.0)], y.ErrorReasons);
    }

    [Fact]
    public void Summarize_EqualEndTimes_InputOrderDecides()
    {
        var y = YieldAnalysis.Summarize([Run("X", 0, Verdict.Fail), Run("X", 0, Verdict.Pass)]);
        Assert.Equal(0.0, y.FirstPassYield);
        Assert.Equal(1.0, y.FinalYield);
        Assert.Equal(YieldAnalysis.UnnamedFailure, Assert.Single(y.FailurePareto).Name);
    }

    [Fact]
    public void Summarize_NoRuns_RatesNull()
    {
        var y = YieldAnalysis.Summarize([]);
        Assert.Equal(0, y.Units);
        Assert.Null(y.FirstPassYield);
        Assert.Null(y.FinalYield);
        Assert.Null(y.RetestRate);
        Assert.Null(y.ErrorRate);
        Assert.Empty(y.FailurePareto);
    }

    [Fact]
    public void Summarize_BlankSerial_ThrowsNamingIndex()
    {
        var ex = Assert.Throws<ArgumentException>(() => YieldAnalysis.Summarize([Run("A", 0, Verdict.Pass), Run("", 1, Verdict.Pass)]));
        Assert.Contains("runs[1]", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Pareto_TiesSortByNameOrdinal()
    {
        var pareto = YieldAnalysis.Pareto(new Dictionary<string, int> { ["b"] = 3, ["a"] = 3, ["c"] = 5 });
        Assert.Equal(["c", "a", "b"], pareto.Select(p => p.Name));
        Assert.Equal(1.0, pareto[^1].CumulativeFraction, 1e-15);
    }

    [Fact]
    public void Summarize_Property_CountsAddUpAndRatesInRange()
    {
        var run = Gen.Select(Gen.Int[0, 30], Gen.Int[0, 500], Gen.Enum<Verdict>())
            .Select(t => Run($"S{t.Item1}", t.Item2, t.Item3, failure: "r" + (t.Item2 % 4)));
        run.Array[1, 80].Sample(runs =>
        {
            var y = YieldAnalysis.Summarize(runs);
            return y.PassRuns + y.FailRuns + y.ErrorRuns == y.Runs
                && y.Units == runs.Select(r => r.Serial).Distinct().Count()
                && y.FirstPassYield is >= 0 and <= 1
                && y.FinalYield is >= 0 and <= 1
                && y.RetestRate >= 0
                && y.UnitsPassedFirstRun <= y.PassRuns
                && y.FailurePareto.Sum(p => p.Count) == y.FailRuns
                && y.ErrorReasons.Sum(p => p.Count) == y.ErrorRuns;
        });
    }
}
