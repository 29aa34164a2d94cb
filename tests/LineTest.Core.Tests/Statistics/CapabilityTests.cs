using CsCheck;
using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class CapabilityTests
{
    private static readonly SpecLimits NistLimits = SpecLimits.Between(8, 20);

    // Mean 16; every moving range 2·1.128, so σ within = MR̄/1.128 = 2 exactly.
    private static double[] AlternatingAroundSixteen(int count)
    {
        var values = new double[count];
        for (var i = 0; i < count; i++)
        {
            values[i] = 16 + (i % 2 == 0 ? -1.128 : 1.128);
        }

        return values;
    }

    // Values rescaled to mean exactly `mean` and sample σ exactly `sigma` (up to rounding).
    private static double[] Standardized(int count, double mean, double sigma, int seed)
    {
        var raw = new double[count];
        Normal.Samples(new Random(seed), raw, 0, 1);
        var m = raw.Average();
        var s = Math.Sqrt(raw.Sum(v => (v - m) * (v - m)) / (count - 1));
        return raw.Select(v => mean + (sigma * (v - m) / s)).ToArray();
    }

    [Fact]
    public void Analyze_NistExampleWithinSigma_GivesCpAndCpk()
    {
        var r = Capability.Analyze(AlternatingAroundSixteen(100), NistLimits);

        // NIST/SEMATECH e-Handbook §6.1.6: USL 20, LSL 8, mean 16, σ 2 → Cp 1.00, Cpu 0.667, Cpl 1.333, Cpk 0.667 [from memory].
        Assert.Equal(16.0, r.Mean!.Value, 1e-12);
        Assert.Equal(2.0, r.StdDevWithin!.Value, 1e-12);
        Assert.Equal(1.00, r.Cp!.Value, 1e-3);
        Assert.Equal(0.667, r.Cpu!.Value, 1e-3);
        Assert.Equal(1.333, r.Cpl!.Value, 1e-3);
        Assert.Equal(0.667, r.Cpk!.Value, 1e-3);
    }

    [Fact]
    public void Analyze_NistExampleOverallSigma_GivesPpAndPpk()
    {
        var r = Capability.Analyze(Standardized(200, 16, 2, seed: 11), NistLimits);

        // NIST/SEMATECH e-Handbook §6.1.6 worked example, with σ as the overall σ [from memory].
        Assert.Equal(2.0, r.StdDevOverall!.Value, 1e-12);
        Assert.Equal(1.00, r.Pp!.Value, 1e-3);
        Assert.Equal(0.667, r.Ppu!.Value, 1e-3);
        Assert.Equal(1.333, r.Ppl!.Value, 1e-3);
        Assert.Equal(0.667, r.Ppk!.Value, 1e-3);
        Assert.Empty(r.Notes);
    }

    [Fact]
    public void BissellInterval_Cpk133N20_Is0883To1777()
    {
        // Bissell (1990): Ĉpk 1.33, n 20 → 95 % bounds 0.883 … 1.777 [derived].
        var ci = Capability.BissellInterval(1.33, 20, 0.95);
        Assert.Equal(0.883, ci.Lower, 1e-3);
        Assert.Equal(1.777, ci.Upper, 1e-3);
        Assert.Equal(0.95, ci.Level);
    }

    [Fact]
    public void SpreadInterval_MatchesChiSquareFormulaWithMathNet()
    {
        // Ĉp·√(χ²(α/2, n−1)/(n−1)) … Ĉp·√(χ²(1−α/2, n−1)/(n−1)) (NIST/SEMATECH §6.1.6 [published]);
        // quantiles from MathNet.Numerics ChiSquared.InvCDF as independent reference.
        var ci = Capability.SpreadInterval(1.5, 30, 0.95);
        Assert.Equal(1.5 * Math.Sqrt(ChiSquared.InvCDF(29, 0.025) / 29), ci.Lower, 1e-9);
        Assert.Equal(1.5 * Math.Sqrt(ChiSquared.InvCDF(29, 0.975) / 29), ci.Upper, 1e-9);
    }

    [Fact]
    public void Analyze_IntervalsBracketTheEstimates()
    {
        var r = Capability.Analyze(Standardized(50, 10, 1, seed: 5), SpecLimits.Between(6, 15));
        Assert.InRange(r.Cp!.Value, r.CpInterval!.Value.Lower, r.CpInterval.Value.Upper);
        Assert.InRange(r.Cpk!.Value, r.CpkInterval!.Value.Lower, r.CpkInterval.Value.Upper);
        Assert.InRange(r.Pp!.Value, r.PpInterval!.Value.Lower, r.PpInterval.Value.Upper);
        Assert.InRange(r.Ppk!.Value, r.PpkInterval!.Value.Lower, r.PpkInterval.Value.Upper);
    }

    [Fact]
    public void Analyze_CpkOne_Expects1350PpmPerSide()
    {
        var r = Capability.Analyze(Standardized(100, 0, 1, seed: 3), SpecLimits.Between(-3, 3));

        // Normal tail at 3σ: Cpk 1.00 → 1350 ppm per side, 2700 both sides [derived].
        Assert.Equal(1.00, r.Ppk!.Value, 1e-9);
        Assert.Equal(1350, r.ExpectedPpmBelow!.Value, 0.5);
        Assert.Equal(1350, r.ExpectedPpmAbove!.Value, 0.5);
        Assert.Equal(2700, r.ExpectedPpmTotal!.Value, 1.0);
    }

    [Fact]
    public void Analyze_Cpk133_Expects33PpmPerSide()
    {
        var r = Capability.Analyze(Standardized(100, 0, 1, seed: 4), SpecLimits.Between(-3.99, 3.99));

        // Normal tail at 3.99σ: Cpk 1.33 → 33 ppm per side, 66 both sides [derived].
        Assert.Equal(33, r.ExpectedPpmAbove!.Value, 0.5);
        Assert.Equal(66, r.ExpectedPpmTotal!.Value, 1.0);
    }

    [Fact]
    public void Analyze_ObservedPpm_CountsStrictlyOutside()
    {
        // 2 of 8 below 0, 1 of 8 above 10; a value on a limit is in specification [hand-computed].
        double[] values = [-1, -0.5, 0, 3, 5, 7, 10, 11];
        var r = Capability.Analyze(values, SpecLimits.Between(0, 10));
        Assert.Equal(250_000, r.ObservedPpmBelow!.Value, 1e-9);
        Assert.Equal(125_000, r.ObservedPpmAbove!.Value, 1e-9);
        Assert.Equal(375_000, r.ObservedPpmTotal!.Value, 1e-9);
    }

    [Fact]
    public void Analyze_UpperLimitOnly_TwoSidedIndicesAreNullNotZero()
    {
        var r = Capability.Analyze(AlternatingAroundSixteen(40), SpecLimits.AtMost(20));
        Assert.Null(r.Cp);
        Assert.Null(r.Pp);
        Assert.Null(r.Cpl);
        Assert.Null(r.CpInterval);
        Assert.Null(r.ObservedPpmBelow);
        Assert.Null(r.ExpectedPpmBelow);
        Assert.Equal(r.Cpu, r.Cpk);
        Assert.Equal(0.667, r.Cpk!.Value, 1e-3);
        Assert.NotNull(r.CpkInterval);
        Assert.Contains(r.Notes, n => n.Contains("One-sided", StringComparison.Ordinal));
    }

    [Fact]
    public void Analyze_LowerLimitOnly_CpkIsCpl()
    {
        var r = Capability.Analyze(AlternatingAroundSixteen(40), SpecLimits.AtLeast(8));
        Assert.Null(r.Cpu);
        Assert.Equal(1.333, r.Cpk!.Value, 1e-3);
    }

    [Fact]
    public void Analyze_AllValuesEqual_IndicesNullWithReason()
    {
        var r = Capability.Analyze([5.0, 5.0, 5.0, 5.0], SpecLimits.Between(0, 10));
        Assert.Equal(0.0, r.StdDevOverall);
        Assert.Null(r.Cp);
        Assert.Null(r.Cpk);
        Assert.Null(r.Ppk);
        Assert.Null(r.ExpectedPpmTotal);
        Assert.Equal(0.0, r.ObservedPpmTotal);
        Assert.Equal(2, r.Notes.Count);
    }

    [Fact]
    public void Analyze_OneValue_OnlyMeanWithReason()
    {
        var r = Capability.Analyze([5.0], SpecLimits.Between(0, 10));
        Assert.Equal(1, r.Count);
        Assert.Equal(5.0, r.Mean);
        Assert.Null(r.StdDevOverall);
        Assert.Null(r.Cpk);
        Assert.Contains(r.Notes, n => n.Contains("Only 1 value", StringComparison.Ordinal));
    }

    [Fact]
    public void Analyze_NoValues_CountZeroWithReason()
    {
        var r = Capability.Analyze([], SpecLimits.Between(0, 10));
        Assert.Equal(0, r.Count);
        Assert.Null(r.Mean);
        Assert.Null(r.ObservedPpmTotal);
        Assert.Contains("No values.", r.Notes);
    }

    [Fact]
    public void Analyze_BadConfidenceLevel_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => Capability.Analyze([1.0, 2.0], SpecLimits.Between(0, 3), 1.0));
    }

    private static readonly Gen<(double[] Values, double Lower, double Width)> Samples =
        Gen.Select(Gen.Double[-50, 50].Array[3, 60], Gen.Double[-80, 20], Gen.Double[0.5, 200]);

    [Fact]
    public void Analyze_Property_CpkNotAboveCpAndPpkNotAbovePp()
    {
        Samples.Sample(s =>
        {
            var r = Capability.Analyze(s.Values, SpecLimits.Between(s.Lower, s.Lower + s.Width));
            return (r.Cpk is not { } cpk || cpk <= r.Cp!.Value + 1e-12)
                && (r.Ppk is not { } ppk || ppk <= r.Pp!.Value + 1e-12);
        });
    }

    [Fact]
    public void Analyze_Property_ShiftMovesMeanNotSigma()
    {
        Gen.Select(Samples, Gen.Double[-1000, 1000]).Sample(t =>
        {
            var ((values, lower, width), shift) = t;
            var a = Capability.Analyze(values, SpecLimits.Between(lower, lower + width));
            var b = Capability.Analyze(values.Select(v => v + shift).ToArray(), SpecLimits.Between(lower + shift, lower + width + shift));
            var tol = 1e-9 * (1 + Math.Abs(shift));
            return Math.Abs(b.Mean!.Value - a.Mean!.Value - shift) < tol
                && Math.Abs(b.StdDevOverall!.Value - a.StdDevOverall!.Value) < tol
                && Math.Abs(b.StdDevWithin!.Value - a.StdDevWithin!.Value) < tol;
        });
    }

    [Fact]
    public void Analyze_Property_IndicesInvariantWhenDataAndLimitsScale()
    {
        Gen.Select(Samples, Gen.Double[0.001, 1000]).Sample(t =>
        {
            var ((values, lower, width), k) = t;
            var a = Capability.Analyze(values, SpecLimits.Between(lower, lower + width));
            var b = Capability.Analyze(values.Select(v => v * k).ToArray(), SpecLimits.Between(lower * k, (lower + width) * k));
            return Close(a.Cp, b.Cp) && Close(a.Cpk, b.Cpk) && Close(a.Pp, b.Pp) && Close(a.Ppk, b.Ppk)
                && Close(a.ExpectedPpmTotal, b.ExpectedPpmTotal);
        });
    }

    private static bool Close(double? x, double? y) =>
        (x, y) switch
        {
            (null, null) => true,
            ({ } p, { } q) => Math.Abs(p - q) <= 1e-7 * Math.Max(1, Math.Abs(p)),
            _ => false,
        };
}
