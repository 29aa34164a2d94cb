using LineTest.Core.Calibration;
using LineTest.Core.Characterisation;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Calibration;

public sealed class TrimAccuracyTests
{
    private static readonly DiodeSensorModel Model = new() { Xti = 3, Ideality = 1.05, ThermalTimeConstantSeconds = 40 };

    // A CTP-40D-like unit: raw = V_f/1.25 V·2²⁰ with V_f(25 °C) = 0.605 V.
    private static double Raw(double celsius) =>
        DiodeTemperatureModel.ForwardVolts(celsius + 273.15, 298.15, 0.605, 1.12, 3, 1.05) / 1.25 * (1 << 20);

    private static FirmwareTrimSpec Spec(int order) => new()
    {
        Order = order,
        Coefficients = new FirmwareCoefficientSpec[]
        {
            new() { Register = "C0", Bits = 32, FractionalBits = 16 },
            new() { Register = "C1", Bits = 32, FractionalBits = 40 },
            new() { Register = "C2", Bits = 32, FractionalBits = 60 },
        }.Take(order + 1).ToArray(),
    };

    private static SequenceDefinition Sequence(DiodeSensorModel? model) => new()
    {
        Id = "t", Revision = 1, Product = "CTP-40D", SerialPattern = ".*",
        Stability = new StabilitySettings { BandC = 0.05, MaxDriftCPerMinute = 0.02, WindowSeconds = 60, TimeoutSeconds = 1800 },
        Soak = new SoakSettings { MaxDriftCPerMinute = 0.05, WindowSeconds = 30, TimeoutSeconds = 900 },
        Setpoints = [], Steps = [],
        RatedRange = new RatedRangeDefinition { LowC = -20, HighC = 40 },
        Trim = new TrimDefinition { Method = TrimMethods.Firmware, SensorModel = model, Firmware = Spec(2) },
    };

    [Fact]
    public void FirmwareFitPoints_QuadraticOverTheModel_FollowsTheDiodeWhereAStraightLineBows()
    {
        List<CalibrationPoint> points = [new("cal-low", -20, Raw(-20)), new("cal-high", 40, Raw(40))];
        var sequence = Sequence(Model);
        Assert.True(TrimAccuracy.Curve(sequence, points, null)!.TryGetValue(out var curve));

        Assert.True(FirmwareTrim.Compute(Spec(2), points, null, TrimAccuracy.FirmwareFitPoints(sequence, curve)).TryGetValue(out var modelled));
        Assert.True(FirmwareTrim.Compute(Spec(1), points).TryGetValue(out var straight));

        var grid = Enumerable.Range(0, 61).Select(i => -20.0 + i).ToArray();
        var modelledWorst = grid.Max(t => Math.Abs(modelled.IndicatedC(Raw(t)) - t));
        var straightWorst = grid.Max(t => Math.Abs(straight.IndicatedC(Raw(t)) - t));
        Assert.InRange(modelledWorst, 0, 0.005);
        Assert.InRange(straightWorst, 0.2, 0.3);
    }

    [Fact]
    public void SoakResidualHalfWidthC_DriftLimitTimesTimeConstant()
    {
        // A first-order lag drifting at r is r·τ from its final value: 0.05 °C/min × 40 s = 0.0333 °C [derived].
        Assert.Equal(0.05 / 60 * 40, TrimAccuracy.SoakResidualHalfWidthC(Sequence(Model)), 12);
        Assert.Equal(0.0, TrimAccuracy.SoakResidualHalfWidthC(Sequence(Model with { ThermalTimeConstantSeconds = null })));
    }

    [Fact]
    public void Curve_NeitherModelNorRange_IsNothingToDo()
    {
        var sequence = Sequence(null) with { RatedRange = null };

        Assert.Null(TrimAccuracy.Curve(sequence, [new("a", -20, 1), new("b", 40, 2)], null));
    }

    [Fact]
    public void CodeObjectiveC_MinimaxOverTheRatedRangeThroughPointsAtThePointsNoneWithoutAccuracyFields()
    {
        CalibrationPoint[] points = [new("a", -19.99, 1), new("b", 40.01, 2)];
        var minimax = Sequence(Model) with { Trim = Sequence(Model).Trim! with { Method = TrimMethods.Dac, Fit = TrimFits.Minimax } };
        var through = minimax with { Trim = minimax.Trim! with { Fit = TrimFits.ThroughPoints } };

        var range = TrimAccuracy.CodeObjectiveC(minimax, points)!;

        Assert.Equal(TrimAccuracy.CodeObjectiveSamples, range.Count);
        Assert.Equal(-20.0, range[0]);
        Assert.Equal(40.0, range[^1]);
        Assert.Equal(0.5, range[1] - range[0], 12);
        Assert.Equal([-19.99, 40.01], TrimAccuracy.CodeObjectiveC(through, points)!);
        Assert.Null(TrimAccuracy.CodeObjectiveC(through with { RatedRange = null, Trim = through.Trim! with { SensorModel = null } }, points));
    }
}
