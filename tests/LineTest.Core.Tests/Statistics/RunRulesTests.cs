using CsCheck;
using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class RunRulesTests
{
    // Centre 0, σ 1 throughout, so each value is its own z. Every sequence below is built to break exactly
    // the rules named, following Western Electric Statistical Quality Control Handbook (1956) zone rules 1–4
    // and Nelson (1984), Journal of Quality Technology 16(4), rules 1–8 [published].
    private const RunRuleFamily We = RunRuleFamily.WesternElectric;
    private const RunRuleFamily Ne = RunRuleFamily.Nelson;

    private static readonly double[] Clean =
    [
        0.5, -0.5, 0.3, 0.2, -0.4, 1.5, -0.3, 0.1, 0.4, -0.6,
        -0.2, 0.5, -1.2, 0.3, 0.6, -0.1, 0.2, -0.7, 1.1, -0.5,
    ];

    private static double[] CleanWith(params (int Index, double Value)[] changes)
    {
        var values = (double[])Clean.Clone();
        foreach (var (index, value) in changes)
        {
            values[index] = value;
        }

        return values;
    }

    private static (RunRuleFamily, int)[] Rules(IReadOnlyList<RunRuleSignal> signals) =>
        signals.Select(s => (s.Family, s.Rule)).Distinct().Order().ToArray();

    [Fact]
    public void Evaluate_CleanSequence_NoSignal()
    {
        Assert.Empty(RunRules.Evaluate(Clean, 0, 1));
    }

    [Fact]
    public void Evaluate_OnePointBeyondThreeSigma_WesternElectric1AndNelson1()
    {
        var signals = RunRules.Evaluate(CleanWith((10, 3.5)), 0, 1);
        Assert.Equal([(We, 1), (Ne, 1)], Rules(signals));
        Assert.All(signals, s => Assert.Equal([10], s.Points));
    }

    [Fact]
    public void Evaluate_TwoOfThreeBeyondTwoSigma_WesternElectric2AndNelson5()
    {
        var signals = RunRules.Evaluate(CleanWith((7, 2.5), (9, 2.4)), 0, 1);
        Assert.Equal([(We, 2), (Ne, 5)], Rules(signals));
        Assert.All(signals, s =>
        {
            Assert.Equal(9, s.Index);
            Assert.Equal([7, 9], s.Points);
        });
    }

    [Fact]
    public void Evaluate_FourOfFiveBeyondOneSigma_WesternElectric3AndNelson6()
    {
        var signals = RunRules.Evaluate(CleanWith((13, 1.3), (14, 1.6), (15, 0.4), (16, 1.2), (17, 1.5), (18, 0.9)), 0, 1);
        Assert.Equal([(We, 3), (Ne, 6)], Rules(signals));
        Assert.All(signals, s =>
        {
            Assert.Equal(17, s.Index);
            Assert.Equal([13, 14, 16, 17], s.Points);
        });
    }

    [Fact]
    public void Evaluate_EightOnOneSide_WesternElectric4Only()
    {
        double[] values = [0.5, 0.2, 0.6, 0.3, 0.7, 0.1, 0.4, 0.2, -0.4, 1.5, -0.3, 0.1, -0.6, 0.3, -1.2, 0.3, -0.2];
        var signals = RunRules.Evaluate(values, 0, 1);
        Assert.Equal([(We, 4)], Rules(signals));
        Assert.Equal(7, signals[0].Index);
        Assert.Equal(Enumerable.Range(0, 8), signals[0].Points);
    }

    [Fact]
    public void Evaluate_NineOnOneSide_Nelson2AndWesternElectric4()
    {
        double[] values = [0.5, 0.2, 0.1, 0.3, 0.7, 0.6, 0.4, 0.2, 0.3, -0.4, 1.5, -0.3, 0.1, -0.6, 1.3, -0.2];
        var signals = RunRules.Evaluate(values, 0, 1);
        Assert.Equal([(We, 4), (Ne, 2)], Rules(signals));
        var nelson = Assert.Single(signals, s => s.Family == Ne);
        Assert.Equal(8, nelson.Index);
        Assert.Equal(Enumerable.Range(0, 9), nelson.Points);
    }

    [Fact]
    public void Evaluate_SixRising_Nelson3Only()
    {
        double[] values = [0.5, -0.3, -0.8, -0.5, -0.1, 0.2, 0.6, 0.9, 0.1, -1.3, 0.4, -0.2];
        var signal = Assert.Single(RunRules.Evaluate(values, 0, 1));
        Assert.Equal((Ne, 3), (signal.Family, signal.Rule));
        Assert.Equal(7, signal.Index);
        Assert.Equal(Enumerable.Range(2, 6), signal.Points);
    }

    [Fact]
    public void Evaluate_FiveFalling_NoTrendSignal()
    {
        double[] values = [0.9, 0.6, 0.2, -0.1, -0.5, 0.3];
        Assert.DoesNotContain(RunRules.Evaluate(values, 0, 1), s => s.Rule == 3 && s.Family == Ne);
    }

    [Fact]
    public void Evaluate_FourteenAlternating_Nelson4Only()
    {
        double[] values = [0.3, -0.2, 0.4, -0.3, 0.5, -0.1, 0.2, -0.4, 1.2, -0.5, 0.1, -0.3, 0.6, -0.2, 0.1, 0.4];
        var signal = Assert.Single(RunRules.Evaluate(values, 0, 1));
        Assert.Equal((Ne, 4), (signal.Family, signal.Rule));
        Assert.Equal(13, signal.Index);
        Assert.Equal(Enumerable.Range(0, 15), signal.Points);
    }

    [Fact]
    public void Evaluate_FifteenWithinOneSigma_Nelson7Only()
    {
        double[] values = [0.5, 0.2, -0.3, -0.1, 0.4, 0.6, -0.2, -0.5, 0.1, 0.3, -0.4, -0.6, 0.2, 0.7, -0.1, -0.3, 1.5];
        var signal = Assert.Single(RunRules.Evaluate(values, 0, 1));
        Assert.Equal((Ne, 7), (signal.Family, signal.Rule));
        Assert.Equal(14, signal.Index);
        Assert.Equal(Enumerable.Range(0, 16), signal.Points);
    }

    [Fact]
    public void Evaluate_EightBeyondOneSigmaBothSides_Nelson8Only()
    {
        double[] values = [1.5, -1.4, 1.3, -1.6, 1.2, -1.5, 1.4, -1.3, 0.2, 0.5];
        var signal = Assert.Single(RunRules.Evaluate(values, 0, 1));
        Assert.Equal((Ne, 8), (signal.Family, signal.Rule));
        Assert.Equal(7, signal.Index);
        Assert.Equal(Enumerable.Range(0, 8), signal.Points);
    }

    [Fact]
    public void Evaluate_LongRun_OneSignalForTheWholeRun()
    {
        var values = Enumerable.Repeat(0.0, 12).Select((_, i) => 0.2 + (0.1 * (i % 3))).Append(-0.5).ToArray();
        var nelson2 = Assert.Single(RunRules.Evaluate(values, 0, 1), s => s.Family == Ne && s.Rule == 2);
        Assert.Equal(Enumerable.Range(0, 12), nelson2.Points);
    }

    [Fact]
    public void Evaluate_PointOnCentreLine_BreaksSameSideRun()
    {
        double[] values = [0.5, 0.2, 0.1, 0.3, 0.0, 0.7, 0.6, 0.4, 0.2, -0.3];
        Assert.DoesNotContain(RunRules.Evaluate(values, 0, 1), s => s.Family == We && s.Rule == 4);
    }

    [Fact]
    public void Evaluate_CentreAndSigma_ScaleZones()
    {
        // 10 + 2·3.5 = 17 is 3.5σ above a centre of 10 with σ = 2.
        var signals = RunRules.Evaluate(Clean.Select(v => 10 + (2 * v)).ToArray(), 10, 2);
        Assert.Empty(signals);
        Assert.Contains(RunRules.Evaluate(CleanWith((10, 3.5)).Select(v => 10 + (2 * v)).ToArray(), 10, 2), s => s.Rule == 1);
    }

    [Fact]
    public void Evaluate_ZeroSigma_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => RunRules.Evaluate(Clean, 0, 0));
    }

    [Fact]
    public void Evaluate_NaNPoint_ThrowsNamingIndex()
    {
        var ex = Assert.Throws<ArgumentException>(() => RunRules.Evaluate(CleanWith((4, double.NaN)), 0, 1));
        Assert.Contains("values[4]", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Evaluate_AnySeries_SameSignalsAsEachRuleOnItsOwn()
    {
        // The rules share passes (Western Electric 1–3 are Nelson 1, 5 and 6; trend and alternation read the same
        // steps); PlainRunRules reads each rule on its own. Values are drawn on a grid of quarter σ from −4 to 4, so
        // zone edges (exactly 1, 2, 3σ), the centre line and equal neighbours all come up, and series are long
        // enough for every rule to fire.
        var grid = Gen.Int[-16, 16].Select(q => q / 4.0);
        Gen.OneOf(grid.Array[0, 40], grid.Array[200, 600], Gen.Double[-4, 4].Array[50, 400]).Sample(values =>
        {
            var expected = PlainRunRules.Evaluate(values, 0, 1);
            var actual = RunRules.Evaluate(values, 0, 1);
            Assert.Equal(expected.Count, actual.Count);
            for (var i = 0; i < expected.Count; i++)
            {
                Assert.Equal((expected[i].Family, expected[i].Rule, expected[i].Index, expected[i].Description), (actual[i].Family, actual[i].Rule, actual[i].Index, actual[i].Description));
                Assert.Equal(expected[i].Points, actual[i].Points);
            }
        });
    }

    [Fact]
    public void Evaluate_LongSeries_EveryRuleFiresAndAgreesWithEachRuleOnItsOwn()
    {
        // A long series on a quarter grid (fixed seed) breaks all twelve rules, so the comparison above cannot pass
        // by both sides finding nothing.
        // Blocks of 50 points, each wandering (strong positive correlation), see-sawing (strong negative) or quiet.
        var random = new Random(1984);
        var values = new List<double>();
        var x = 0.0;
        for (var block = 0; block < 400; block++)
        {
            var (phi, size) = (block % 3) switch { 0 => (0.9, 1.0), 1 => (-0.9, 1.0), _ => (0.0, 0.3) };
            for (var i = 0; i < 50; i++)
            {
                x = (phi * x) + (size * ((random.NextDouble() * 2) - 1));
                values.Add(Math.Round(x * 4) / 4);
            }
        }

        var actual = RunRules.Evaluate(values.ToArray(), 0, 1);
        Assert.Equal(12, actual.Select(s => (s.Family, s.Rule)).Distinct().Count());
        var expected = PlainRunRules.Evaluate(values.ToArray(), 0, 1);
        Assert.Equal(expected.Select(s => (s.Family, s.Rule, s.Index, string.Join(',', s.Points))), actual.Select(s => (s.Family, s.Rule, s.Index, string.Join(',', s.Points))));
    }
}
