using LineTest.Core.Statistics;
using LineTest.Reports.Building;
using LineTest.Reports.Loading;
using LineTest.Reports.Tests.Support;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.Statistics;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Reports.Tests.Building;

public sealed class ReportBuilderTests
{
    private static readonly FakeTimeProvider Clock = new(new DateTimeOffset(2025, 3, 5, 8, 0, 0, TimeSpan.Zero));

    private static async Task<QualityReport> SmallReportAsync(ReportQuery? query = null)
    {
        var directory = await SmallLine.CreateAsync();
        query ??= ReportQuery.All;
        var data = await ResultsLoader.LoadAsync([directory], query);
        return ReportBuilder.Build(data, query, Clock);
    }

    [Fact]
    public async Task Build_SmallLine_YieldMatchesHandCount()
    {
        var report = await SmallReportAsync();
        var y = report.Yield;

        // 6 runs of 4 units; first runs: U1 pass, U2 fail, U3 error, U4 pass → FPY 2/4;
        // last runs: U1 pass, U2 pass, U3 fail, U4 pass → final 3/4; retests (6 − 4)/4; 1 error run of 6.
        Assert.Equal(6, y.Runs);
        Assert.Equal(4, y.Units);
        Assert.Equal(0.5, y.FirstPassYield);
        Assert.Equal(0.75, y.FinalYield);
        Assert.Equal(0.5, y.RetestRate);
        Assert.Equal(1.0 / 6, y.ErrorRate!.Value, 12);
        var bar = Assert.Single(y.FailurePareto);
        Assert.Equal(("offset", 2), (bar.Name, bar.Count));
        Assert.Equal(("unit silent", 1), (y.ErrorReasons[0].Name, y.ErrorReasons[0].Count));
        Assert.Equal(Clock.GetUtcNow(), report.GeneratedUtc);
    }

    [Fact]
    public async Task Build_TwoSidedReading_MatchesMathNetAndHandComputedIndices()
    {
        var report = await SmallReportAsync();
        var offset = report.Readings.Single(r => r.Name == "offset");
        var c = offset.Capability;

        // Mean and overall σ (n − 1) against MathNet.Numerics as an independent reference.
        Assert.Equal(6, offset.Count);
        Assert.Equal(SmallLine.Offset.Mean(), c.Mean!.Value, 12);
        Assert.Equal(SmallLine.Offset.StandardDeviation(), c.StdDevOverall!.Value, 12);

        // Within σ = MR̄/1.128 in run order (ASTM E2587, d2 for n = 2 [published]); by hand:
        // |5.5−4.0| + |6.1−5.5| + |3.2−6.1| + |7.0−3.2| + |4.4−7.0| = 1.5 + 0.6 + 2.9 + 3.8 + 2.6 = 11.4; MR̄ = 2.28.
        var sigmaWithin = 2.28 / 1.128;
        Assert.Equal(sigmaWithin, c.StdDevWithin!.Value, 10);

        // NIST/SEMATECH e-Handbook §6.1.6: Cp = (USL − LSL)/6σ, Cpk = min(USL − μ, μ − LSL)/3σ [published].
        var mean = SmallLine.Offset.Mean();
        Assert.Equal(10 / (6 * sigmaWithin), c.Cp!.Value, 10);
        Assert.Equal(Math.Min(10 - mean, mean) / (3 * sigmaWithin), c.Cpk!.Value, 10);
        var sigmaOverall = SmallLine.Offset.StandardDeviation();
        Assert.Equal(Math.Min(10 - mean, mean) / (3 * sigmaOverall), c.Ppk!.Value, 10);

        // Bissell (1990) 95 % bounds: Ĉpk ± 1.959964·√(1/(9n) + Ĉpk²/(2ν)) [published formula], with ν the effective
        // degrees of freedom of the moving-range σ (not n − 1) [derived: Capability.MovingRangeDegreesOfFreedom].
        var nu = Capability.MovingRangeDegreesOfFreedom(6);
        Assert.Equal(nu, c.WithinDegreesOfFreedom!.Value, 12);
        var cpk = c.Cpk.Value;
        var half = Normal.InvCDF(0, 1, 0.975) * Math.Sqrt((1.0 / 54) + (cpk * cpk / (2 * nu)));
        Assert.Equal(cpk - half, c.CpkInterval!.Value.Lower, 9);
        Assert.Equal(cpk + half, c.CpkInterval!.Value.Upper, 9);

        // Chi-square bounds on Cp with MathNet's quantiles: Ĉp·√(χ²(α/2, ν)/ν) … [published formula, ν derived].
        Assert.Equal(c.Cp.Value * Math.Sqrt(ChiSquared.InvCDF(nu, 0.025) / nu), c.CpInterval!.Value.Lower, 6);
        Assert.Equal(c.Cp.Value * Math.Sqrt(ChiSquared.InvCDF(nu, 0.975) / nu), c.CpInterval!.Value.Upper, 6);

        // No value lies outside 0…10: observed ppm is 0, not undefined; expected ppm from the normal tails.
        Assert.Equal(0.0, c.ObservedPpmTotal);
        var expected = 1e6 * (Normal.CDF(mean, sigmaOverall, 0) + (1 - Normal.CDF(mean, sigmaOverall, 10)));
        Assert.Equal(expected, c.ExpectedPpmTotal!.Value, 4);
    }

    [Fact]
    public async Task Build_UpperLimitOnly_SpreadIndicesAreNullNotZero()
    {
        var report = await SmallReportAsync();
        var c = report.Readings.Single(r => r.Name == "leak").Capability;

        Assert.Null(c.Cp);
        Assert.Null(c.Pp);
        Assert.Null(c.CpInterval);
        Assert.Null(c.Cpl);
        Assert.NotNull(c.Cpk);

        // One-sided: Cpk = (USL − μ)/3σ within (NIST/SEMATECH §6.1.6 [published]).
        var mean = SmallLine.Leak.Mean();
        var mr = (0.4 + 0.6 + 0.3 + 0.8 + 0.7) / 5;
        Assert.Equal((5 - mean) / (3 * (mr / 1.128)), c.Cpk!.Value, 9);
    }

    [Fact]
    public async Task Build_NoLimits_HasSpreadButNoCapability()
    {
        var report = await SmallReportAsync();
        var slope = report.Readings.Single(r => r.Name == "slope");

        Assert.False(slope.HasLimits);
        Assert.Equal(6, slope.Count);
        Assert.Equal(SmallLine.Slope.Mean(), slope.Capability.Mean!.Value, 12);
        Assert.Equal(SmallLine.Slope.StandardDeviation(), slope.Capability.StdDevOverall!.Value, 12);
        Assert.Null(slope.Capability.Cpk);
        Assert.Null(slope.Capability.Ppk);
        Assert.Null(slope.Capability.ObservedPpmTotal);
        Assert.Null(slope.Capability.ExpectedPpmTotal);
    }

    [Fact]
    public async Task Build_SlotBias_FAndPMatchMathNetFisherSnedecor()
    {
        var report = await SmallReportAsync();
        var entry = report.Slots.Single(s => s.Name == "offset");
        var result = Assert.IsType<LineTest.Core.Statistics.SlotBiasResult>(entry.Result);

        // Slot 1 holds runs 1, 4, 5 and slot 2 runs 2, 3, 6 (see SmallLine.Runs). One-way ANOVA by hand.
        double[] slot1 = [4.0, 3.2, 7.0];
        double[] slot2 = [5.5, 6.1, 4.4];
        var grand = SmallLine.Offset.Mean();
        var ssb = (3 * Math.Pow(slot1.Mean() - grand, 2)) + (3 * Math.Pow(slot2.Mean() - grand, 2));
        var ssw = slot1.Sum(v => Math.Pow(v - slot1.Mean(), 2)) + slot2.Sum(v => Math.Pow(v - slot2.Mean(), 2));
        var f = (ssb / 1) / (ssw / 4);
        Assert.Equal(f, result.FStatistic, 10);
        Assert.Equal(1 - FisherSnedecor.CDF(1, 4, f), result.PValue, 8);
        Assert.Equal(slot1.Mean() - grand, result.Groups[0].OffsetFromGrandMean, 12);
        Assert.Equal(slot2.Mean() - grand, result.Groups[1].OffsetFromGrandMean, 12);
    }

    [Fact]
    public async Task Build_GroupedBySlot_GivesPerGroupYieldAndStatistics()
    {
        var report = await SmallReportAsync(new ReportQuery { GroupBy = ReportGrouping.Slot });

        Assert.Equal(["1", "2"], report.Groups.Select(g => g.Key));
        var slot1 = report.Groups[0];

        // Slot 1: U1 pass; U3 error then fail → 3 runs, 2 units, FPY 1/2, final 1/2.
        Assert.Equal((3, 2, 0.5, 0.5), (slot1.Yield.Runs, slot1.Yield.Units, slot1.Yield.FirstPassYield, slot1.Yield.FinalYield));
        var offset = slot1.Readings.Single(r => r.Name == "offset");
        Assert.Equal(3, offset.Count);
        Assert.Equal(new[] { 4.0, 3.2, 7.0 }.Mean(), offset.Mean!.Value, 12);
        Assert.Equal(new[] { 4.0, 3.2, 7.0 }.StandardDeviation(), offset.StdDevOverall!.Value, 12);
    }

    [Fact]
    public async Task Build_SlotFilter_KeepsOnlyThatSlot()
    {
        var report = await SmallReportAsync(new ReportQuery { Slot = 2, ReadingNames = ["offset"] });

        Assert.Equal(3, report.Yield.Runs);
        var reading = Assert.Single(report.Readings);
        Assert.Equal([5.5, 6.1, 4.4], reading.Values.ToArray());
    }

    [Fact]
    public async Task Build_TwoDatabases_MergesValuesInTimeOrder()
    {
        // Same line twice, the second an hour and a half later: values interleave by end time.
        var first = await SmallLine.CreateAsync();
        var second = await SmallLine.CreateAsync();
        var data = await ResultsLoader.LoadAsync([second, first], ReportQuery.All);
        var report = ReportBuilder.Build(data, ReportQuery.All, Clock);

        var offset = report.Readings.Single(r => r.Name == "offset");
        Assert.Equal(12, offset.Count);
        Assert.Equal(SmallLine.Offset.SelectMany(v => new[] { v, v }), offset.Values.ToArray());
        Assert.Equal(12, report.Yield.Runs);
    }

    [Fact]
    public async Task Build_DailyYield_OneDayOfRuns()
    {
        var report = await SmallReportAsync();

        var day = Assert.Single(report.DailyYield);
        Assert.Equal(("2025-03-04", 6, 0.5, 0.75), (day.Day, day.Runs, day.FirstPassYield, day.FinalYield));
    }
}
