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

    // A CTP-40A-like unit (y = 3.75 − 5·V_f) with its own XTI and a read-out non-linearity β about 0.62 V, as the simulator
    // builds them: neither is the model's, so only the unit's own points can say how much it bows.
    private static double Analog(double celsius, double xti = 3.25, double beta = 0.006)
    {
        var vf = DiodeTemperatureModel.ForwardVolts(celsius + 273.15, 298.15, 0.6, 1.12, xti, 1.05);
        return 3.75 - (5 * (vf + (beta * (vf - 0.62) * (vf - 0.62))));
    }

    private static SequenceDefinition Linear(string fit) => Sequence(Model) with
    {
        Trim = Sequence(Model).Trim! with { Method = TrimMethods.Dac, Fit = fit, Firmware = null },
    };

    private static List<CalibrationPoint> ThreePoints(Func<double, double> output) =>
        [new("cal-low", -20, output(-20)), new("verify", 5, output(5)), new("cal-high", 40, output(40))];

    [Fact]
    public void Line_MinimaxWithThreePoints_EquioscillatesOnTheUnitsOwnCurve()
    {
        // Chebyshev equioscillation (Powell, Approximation Theory and Methods, ch. 7 [from memory]): the best line's error
        // reaches its largest magnitude three times with alternating signs. With the unit's curvature fitted to three
        // points the line is the best one for this unit's own curve, so it comes within a few µV of the best line for the
        // true curve, which a line from the model's nominal curvature (two points) misses by the bow's spread.
        var sequence = Linear(TrimFits.Minimax);
        Assert.True(TrimAccuracy.Curve(sequence, ThreePoints(c => Analog(c)), null)!.TryGetValue(out var curve));
        Assert.True(curve.CurvatureFitted);

        var line = TrimAccuracy.Line(sequence, curve, ThreePoints(c => Analog(c)))!;
        var grid = Enumerable.Range(0, 601).Select(i => -20.0 + (i * 0.1)).ToArray();
        var errors = grid.Select(t => curve.OutputAt(t) - line.Intercept - (line.Slope * t)).ToArray();
        var h = errors.Max(Math.Abs);
        Assert.Equal(h, Math.Abs(errors[0]), 7);
        Assert.Equal(h, Math.Abs(errors[^1]), 7);
        Assert.Equal(h, Math.Abs(errors[1..^1].Where(e => Math.Sign(e) != Math.Sign(errors[0])).DefaultIfEmpty(0).Max(Math.Abs)), 7);
        Assert.Equal(Math.Sign(errors[0]), Math.Sign(errors[^1]));

        var truthBest = MinimaxLine.Fit(c => Analog(c), -20, 40);
        var onTruth = grid.Max(t => Math.Abs(Analog(t) - line.Intercept - (line.Slope * t)));
        Assert.InRange(onTruth - truthBest.MaxAbsError, 0, 5e-6);
        Assert.True(TrimAccuracy.Curve(sequence, [new("cal-low", -20, Analog(-20)), new("cal-high", 40, Analog(40))], null)!.TryGetValue(out var nominal));
        var twoPoint = TrimAccuracy.Line(sequence, nominal, [])!;
        Assert.True(grid.Max(t => Math.Abs(Analog(t) - twoPoint.Intercept - (twoPoint.Slope * t))) - truthBest.MaxAbsError > 2e-5);
    }

    [Fact]
    public void Line_ThroughPointsWithThreePoints_GoesThroughTheOuterTwo()
    {
        var sequence = Linear(TrimFits.ThroughPoints);
        var points = ThreePoints(c => Analog(c));
        Assert.True(TrimAccuracy.Curve(sequence, points, null)!.TryGetValue(out var curve));

        var line = TrimAccuracy.Line(sequence, curve, points)!;

        Assert.Equal(Analog(-20), line.Intercept + (line.Slope * -20), 12);
        Assert.Equal(Analog(40), line.Intercept + (line.Slope * 40), 12);
        Assert.Equal([-20.0, 40.0], TrimAccuracy.CodeObjectiveC(sequence, points)!);
    }

    [Fact]
    public void Curve_FirmwareWithThreePoints_KeepsTheModelsCurvature()
    {
        var points = ThreePoints(Raw);

        Assert.True(TrimAccuracy.Curve(Sequence(Model), points, null)!.TryGetValue(out var curve));

        Assert.False(curve.CurvatureFitted);
        Assert.False(TrimAccuracy.FitsUnitCurvature(Sequence(Model), 3));
        Assert.False(TrimAccuracy.FitsUnitCurvature(Linear(TrimFits.Minimax), 2));
    }

    [Fact]
    public void Readings_CurvatureFitted_StoreTheCurvatureAndTheMiddlePointsResidualInDegrees()
    {
        var sequence = Linear(TrimFits.Minimax);
        var points = ThreePoints(c => Analog(c));
        Assert.True(TrimAccuracy.Curve(sequence, points, null)!.TryGetValue(out var curve));
        var prediction = LineTest.Core.Decisions.RatedRangeBudget.Predict(curve, c => c, [new(0, null, 0, null), new(0, null, 0, null), new(0, null, 0, null)], -20, 40);

        var readings = TrimAccuracy.Readings("trim", sequence.RatedRange!, prediction, curve, ["cal-low", "verify", "cal-high"], DateTimeOffset.UnixEpoch);

        var curvature = readings.Single(r => r.Name == "trim.model.curvature");
        Assert.Equal(curve.CurvatureScale, curvature.Value!.Value, 12);
        Assert.InRange(curvature.Value!.Value, 1.02, 1.2);
        var residual = readings.Single(r => r.Name.StartsWith("trim.model.residual.", StringComparison.Ordinal));
        Assert.Equal("trim.model.residual.verify", residual.Name);
        Assert.Equal(curve.ResidualsFromNominalBow[1] / curve.Slope, residual.Value!.Value, 12);
        Assert.Equal("degC", residual.Unit);
        Assert.All(readings, r => Assert.Equal("trim", r.Step));
    }
}
