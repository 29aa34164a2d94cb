using LineTest.Core.Results;
using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class YieldCountsTests
{
    private static readonly DateTimeOffset T0 = new(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);

    [Fact]
    public void Summarize_CountsOfTwoDisjointUnitSetsAdded_SameAsTheirRunsTogether()
    {
        // Units A, B in one set, C in the other [hand-made; the expectation is Summarize of all runs together].
        RunOutcome[] first = [new("A", T0, Verdict.Fail, "verify.error", null), new("A", T0.AddMinutes(20), Verdict.Pass, null, null), new("B", T0.AddMinutes(5), Verdict.Pass, null, null)];
        RunOutcome[] second = [new("C", T0.AddMinutes(7), Verdict.Error, null, "reference thermometer lost"), new("C", T0.AddMinutes(30), Verdict.Fail, " verify.error ", null)];
        var counts = Count(first);
        counts.Add(Count(second));

        var added = YieldAnalysis.Summarize(counts);
        var together = YieldAnalysis.Summarize([.. first, .. second]);

        Assert.Equivalent(together, added, strict: true);
        Assert.Equal(2, added.FailurePareto.Single().Count);
        Assert.Equal(1d / 3, added.FirstPassYield);
    }

    [Fact]
    public void AddRuns_BlankFailureAndErrorNames_CountUnderTheUnnamedBars()
    {
        var counts = new YieldCounts();
        counts.AddRuns(Verdict.Fail, "  ", 3);
        counts.AddRuns(Verdict.Error, null, 2);
        counts.AddRuns(Verdict.Pass, "ignored", 5);

        Assert.Equal(3, counts.Failures[YieldAnalysis.UnnamedFailure]);
        Assert.Equal(2, counts.Errors[YieldAnalysis.UnspecifiedError]);
        Assert.Equal(10, counts.Runs);
    }

    [Fact]
    public void AddUnits_MorePassedThanUnits_Refused()
    {
        var counts = new YieldCounts();

        Assert.Throws<ArgumentOutOfRangeException>(() => counts.AddUnits(2, 3, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => counts.AddRuns(Verdict.Pass, null, -1));
    }

    [Fact]
    public void Summarize_NoCounts_SameAsNoRuns()
    {
        Assert.Equivalent(YieldAnalysis.Summarize([]), YieldAnalysis.Summarize(new YieldCounts()), strict: true);
    }

    private static YieldCounts Count(IReadOnlyList<RunOutcome> runs)
    {
        // The counts a source would make: runs by verdict and name, units with their first and last run.
        var counts = new YieldCounts();
        foreach (var run in runs)
        {
            counts.AddRuns(run.Verdict, run.Verdict == Verdict.Fail ? run.FailureName : run.ErrorReason);
        }

        var units = runs.GroupBy(r => r.Serial).Select(g => (First: g.MinBy(r => r.EndedUtc)!, Last: g.MaxBy(r => r.EndedUtc)!)).ToList();
        counts.AddUnits(units.Count, units.Count(u => u.First.Verdict == Verdict.Pass), units.Count(u => u.Last.Verdict == Verdict.Pass));
        return counts;
    }
}
