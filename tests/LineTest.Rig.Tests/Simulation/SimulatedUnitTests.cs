using LineTest.Core.Trims;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedUnitTests
{
    private static readonly SimulatedUnitDesign Design = SimulatedUnitDesign.Ctp40A;

    [Fact]
    public void TrueOutputVolts_NominalCodesAcrossParts_NearDemoTransfer()
    {
        var factory = SimulatedFixtures.Factory(seed: 5);
        var units = Enumerable.Range(0, 400).Select(_ => factory.NextUnit(UnitDefect.None)).ToList();

        var atZero = units.Select(u => u.TrueOutputVolts(0)).ToList();
        var slopes = units.Select(u => (u.TrueOutputVolts(50) - u.TrueOutputVolts(0)) / 50).ToList();

        // Design intent: about 0.5 V at 0 °C and +10 mV/°C before trim; the spread is what the trim removes.
        Assert.Equal(0.5, atZero.Average(), 0.03);
        Assert.Equal(0.010, slopes.Average(), 0.0003);
        Assert.All(atZero, v => Assert.InRange(v, 0.2, 0.8));
        Assert.All(slopes, s => Assert.InRange(s, 0.0085, 0.0115));
    }

    [Fact]
    public void TrueOutputVolts_AfterTrimByDacTrimSpecEquations_ReachesTargetWithinFewMillivolts()
    {
        var spec = Design.ToDacTrimSpec();
        var factory = SimulatedFixtures.Factory(seed: 99);
        for (var i = 0; i < 200; i++)
        {
            var unit = factory.NextUnit(UnitDefect.None);
            var codes = TrimByHand(spec, unit.TrueOutputVolts(0), unit.TrueOutputVolts(50), 0, 50);

            unit.WriteWorking(codes);
            unit.Store();

            // A straight-line trim through 0 and 50 degC leaves the diode's curvature: at -20 degC about
            // ½·XTI·n·(k/q)/T·(T − 0)(T − 50)·G ≈ ½·3·1.05·86.17 µV/K / 263 K · 1400 K² · 5 ≈ 3.6 mV [derived], plus the
            // spread of XTI, n and the read-out non-linearity and the DAC steps.
            foreach (var celsius in new[] { 0.0, 25.0, 50.0, -20.0 })
            {
                Assert.InRange(unit.TrueErrorVolts(spec.Target, celsius), -0.005, 0.005);
            }
        }
    }

    [Fact]
    public void TrueOutputVolts_OpenSensor_RailsNearSupplyWithNoSlope()
    {
        var unit = SimulatedFixtures.Factory().NextUnit(UnitDefect.OpenSensor);

        var cold = unit.TrueOutputVolts(0);
        var hot = unit.TrueOutputVolts(50);

        Assert.InRange(cold, 3.18, 3.2);
        Assert.Equal(cold, hot);
    }

    [Fact]
    public void TrueOutputVolts_StuckDac_IgnoresWrittenAndStoredCodes()
    {
        var unit = SimulatedFixtures.Factory().NextUnit(UnitDefect.StuckDac);
        var before = unit.TrueOutputVolts(25);

        unit.WriteWorking(new Dictionary<string, long> { ["GAIN"] = 3000, ["OFFSET"] = 100 });
        unit.Store();

        Assert.Equal(before, unit.TrueOutputVolts(25));
        Assert.Equal(before, unit.TrueOutputVoltsAsShipped(25));
        Assert.Equal(3000, unit.StoredRegisters["GAIN"]);
    }

    [Fact]
    public void TrueOutputVolts_GoodUnitWrittenButNotStored_AsShippedKeepsNominal()
    {
        var unit = SimulatedFixtures.Factory().NextUnit(UnitDefect.None);
        var nominal = unit.TrueOutputVolts(25);

        unit.WriteWorking(new Dictionary<string, long> { ["OFFSET"] = 2148 });

        // 100 codes × ≈0.5 mV = ≈50 mV (actual step within ±0.5 % of declared).
        Assert.Equal(0.05, unit.TrueOutputVolts(25) - nominal, 0.0003);
        Assert.Equal(nominal, unit.TrueOutputVoltsAsShipped(25));
    }

    [Fact]
    public void TrueOutputVolts_HugeOffset_ClipsAtOutputSwing()
    {
        var unit = SimulatedFixtures.Factory().NextUnit(UnitDefect.None);

        Assert.Equal(Design.OutputMinVolts, unit.TrueOutputVolts(-40, 2048, 0));
        Assert.Equal(Design.OutputMaxVolts, unit.TrueOutputVolts(150, 4095, 4095));
    }

    [Fact]
    public void TrueErrorC_IsVoltsErrorOverTargetSlope()
    {
        var unit = SimulatedFixtures.Factory().NextUnit(UnitDefect.None);
        var target = Design.Target;

        Assert.Equal(unit.TrueErrorVolts(target, 30) / 0.010, unit.TrueErrorC(target, 30), 9);
        Assert.True(unit.IsTrulyWithin(target, Math.Abs(unit.TrueErrorC(target, 30)) + 1e-9, [30]));
        Assert.False(unit.IsTrulyWithin(target, Math.Abs(unit.TrueErrorC(target, 30)) - 1e-6, [30]));
    }

    [Fact]
    public void Constructor_NewUnit_RegistersNominalAndSensorAtAmbient()
    {
        var unit = SimulatedFixtures.Factory().NextUnit();

        Assert.Equal(2048, unit.WorkingRegisters["GAIN"]);
        Assert.Equal(2048, unit.StoredRegisters["OFFSET"]);
        Assert.Equal(SimulatedRig.DefaultAmbientC, unit.SensorC);
        Assert.Null(unit.SensorTime);
    }

    /// <summary>
    /// The gain-and-offset DAC trim worked out by hand from <see cref="DacTrimSpec"/>'s model
    /// V = G_design·(1 + s_g·(g − g0))·u(T) + s_o·(o − o0), from outputs at nominal codes at two temperatures.
    /// </summary>
    internal static Dictionary<string, long> TrimByHand(DacTrimSpec spec, double volts1, double volts2, double celsius1, double celsius2)
    {
        var slope = (volts2 - volts1) / (celsius2 - celsius1);
        var gainCode = (long)Math.Round(spec.Gain.Nominal + (((spec.Target.SlopeVoltsPerC / slope) - 1) / spec.Gain.Step));
        var gainFactor = 1 + (spec.Gain.Step * (gainCode - spec.Gain.Nominal));
        var offsetVolts = ((spec.Target.VoltsAt(celsius1) - (gainFactor * volts1)) + (spec.Target.VoltsAt(celsius2) - (gainFactor * volts2))) / 2;
        var offsetCode = (long)Math.Round(spec.Offset.Nominal + (offsetVolts / spec.Offset.Step));
        return new Dictionary<string, long> { [spec.Gain.Register] = gainCode, [spec.Offset.Register] = offsetCode };
    }

    [Fact]
    public void ResistorOutput_TrimmedWithExactPartsFromResistorTrim_HasThePredictedErrorAtItsCalibrationPoints()
    {
        // The simulator's network and ResistorTrimSpec's model must agree: with noise-free calibration outputs and
        // parts of exactly the chosen nominal values, the unit's error at each calibration point is the one predicted.
        var design = SimulatedUnitDesign.Ctp40R;
        var spec = design.ToResistorTrimSpec();
        var factory = SimulatedFixtures.Factory(seed: 41, design: design);
        for (var i = 0; i < 100; i++)
        {
            var unit = factory.NextUnit(UnitDefect.None);
            var points = new[] { -20.0, 40.0 }.Select(t => new LineTest.Core.Calibration.CalibrationPoint($"p{t}", t, unit.TrueOutputVolts(t))).ToList();
            var trim = ResistorTrim.Compute(spec, points).Value;
            Assert.True(trim.InRange, string.Join("; ", trim.Problems));

            unit.Fit(trim.Gain.Position, trim.Gain.EffectiveOhms);
            unit.Fit(trim.Offset.Position, trim.Offset.EffectiveOhms);

            foreach (var predicted in trim.PredictedErrors)
            {
                Assert.Equal(predicted.ErrorC, unit.TrueErrorC(design.Target, predicted.TemperatureC), 1e-9);
            }
        }
    }

    [Fact]
    public void ResistorOutput_GoodParts_NeedValuesInsideTheDesignRanges()
    {
        var design = SimulatedUnitDesign.Ctp40R;
        var spec = design.ToResistorTrimSpec();
        var factory = SimulatedFixtures.Factory(seed: 42, design: design);

        var trims = Enumerable.Range(0, 400).Select(_ => factory.NextUnit(UnitDefect.None))
            .Select(u => ResistorTrim.Compute(spec, [new("low", -20, u.TrueOutputVolts(-20)), new("high", 40, u.TrueOutputVolts(40))]).Value)
            .ToList();

        Assert.All(trims, t => Assert.True(t.InRange, string.Join("; ", t.Problems)));

        // Untrimmed, the parts are far from the target: a real trim is needed.
        Assert.Contains(trims, t => Math.Abs(t.Gain.IdealOhms / design.GainFittedOhms - 1) > 0.05);
    }

    [Fact]
    public void Fit_BadJointDefect_LeavesTheGainPositionOpen()
    {
        var unit = SimulatedFixtures.Factory(seed: 43, design: SimulatedUnitDesign.Ctp40R).NextUnit(UnitDefect.StuckDac);

        unit.Fit("R7", 9_530);
        unit.Fit("R8", 68_100);

        Assert.Null(unit.FittedOhms["R7"]);
        Assert.Equal(68_100, unit.FittedOhms["R8"]);
        Assert.Throws<InvalidOperationException>(() => unit.Fit("R9", 1_000));
    }

    [Fact]
    public void ReportedC_TrimmedWithFirmwareTrimCoefficients_HasThePredictedErrorAtItsCalibrationPoints()
    {
        var design = SimulatedUnitDesign.Ctp40D;
        var spec = design.ToFirmwareTrimSpec(2);
        var factory = SimulatedFixtures.Factory(seed: 44, design: design);
        for (var i = 0; i < 100; i++)
        {
            var unit = factory.NextUnit(UnitDefect.None);
            var points = new[] { -20.0, 5.0, 40.0 }.Select(t => new LineTest.Core.Calibration.CalibrationPoint($"p{t}", t, unit.TrueRawCounts(t))).ToList();
            var trim = FirmwareTrim.Compute(spec, points).Value;
            Assert.True(trim.InRange, string.Join("; ", trim.Problems));

            unit.WriteWorking(trim.Registers.ToDictionary(r => r.Register, r => r.Value));
            unit.Store();

            foreach (var predicted in trim.PredictedErrors)
            {
                Assert.Equal(predicted.ErrorC, unit.TrueReportedErrorC(predicted.TemperatureC), 1e-6);
            }

            // A quadratic through three points of the diode leaves only millidegrees between them.
            Assert.InRange(unit.TrueReportedErrorC(20), -0.01, 0.01);
        }
    }

    [Fact]
    public void Store_DigitalUnitWithFailingMemory_KeepsTheFactoryCoefficients()
    {
        var design = SimulatedUnitDesign.Ctp40D;
        var unit = SimulatedFixtures.Factory(seed: 45, design: design).NextUnit(UnitDefect.StuckDac);

        unit.WriteWorking(new Dictionary<string, long> { ["C0"] = 1 });
        unit.Store();

        Assert.Equal(design.FactoryCoefficientRegisters()["C0"], unit.StoredRegisters["C0"]);
        Assert.Equal(1, unit.WorkingRegisters["C0"]);
    }

    [Fact]
    public void TrueRawCounts_OpenSensor_ReadsFullScale()
    {
        var design = SimulatedUnitDesign.Ctp40D;
        var open = SimulatedFixtures.Factory(seed: 46, design: design).NextUnit(UnitDefect.OpenSensor);
        var good = SimulatedFixtures.Factory(seed: 46, design: design).NextUnit(UnitDefect.None);

        Assert.Equal(design.AdcFullScaleCounts, open.TrueRawCounts(5));

        // About −1670 counts/°C: 2 mV/°C of the diode on a 1.25 V, 20-bit converter.
        Assert.InRange((good.TrueRawCounts(40) - good.TrueRawCounts(-20)) / 60, -1800, -1550);
    }

    [Fact]
    public async Task FollowWell_WithATipLag_TrailsTheBodyBySlopeTimesTipLag()
    {
        // [derived] two first-order lags in series behind a ramp r trail it by r·(τ + τ_tip) once several τ have passed,
        // so the die trails a part without a tip lag (same seed, same τ) by r·τ_tip; the tip lag is the fraction of the
        // unit's own τ the fixture gives. Block: 10 °C/min from 23 °C to 80 °C, read every 2 s for 5 minutes.
        var tipped = SimulatedFixtures.Simulation() with { UnitTipLagFraction = 0.1 };
        var plain = SimulatedFixtures.Simulation();
        var withTip = SimulatedFixtures.Factory(seed: 5, simulation: tipped).NextUnit(UnitDefect.None);
        var without = SimulatedFixtures.Factory(seed: 5, simulation: plain).NextUnit(UnitDefect.None);
        var clock = SimulatedFixtures.Clock();
        var block = new SimulatedDryBlock(SimulatedFixtures.Source(), SimulatedFixtures.Simulation(blockNoiseC: 0), clock, 1);
        withTip.PlaceAt(23, clock.GetUtcNow());
        without.PlaceAt(23, clock.GetUtcNow());
        await block.SetSetpointAsync(80, CancellationToken.None);
        for (var t = 0; t < 300; t += 2)
        {
            clock.Advance(TimeSpan.FromSeconds(2));
            withTip.FollowWell(block, 1, clock.GetUtcNow());
            without.FollowWell(block, 1, clock.GetUtcNow());
        }

        var tau = withTip.Parameters.LagTimeConstantSeconds;
        Assert.Equal(tau, without.Parameters.LagTimeConstantSeconds);
        Assert.Equal(0.1 * tau, withTip.Parameters.TipLagTimeConstantSeconds, 12);
        Assert.Equal(0, without.Parameters.TipLagTimeConstantSeconds);
        Assert.InRange(without.SensorC - withTip.SensorC - (10.0 / 60 * 0.1 * tau), -0.01, 0.01);
    }
}
