using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedUnitDesignTests
{
    [Fact]
    public void ToDacTrimSpec_Ctp40A_CarriesDesignConstants()
    {
        var spec = SimulatedUnitDesign.Ctp40A.ToDacTrimSpec();

        Assert.Equal(("GAIN", 0L, 4095L, 2048L, 0.0001), (spec.Gain.Register, spec.Gain.Min, spec.Gain.Max, spec.Gain.Nominal, spec.Gain.Step));
        Assert.Equal(("OFFSET", 0L, 4095L, 2048L, 0.0005), (spec.Offset.Register, spec.Offset.Min, spec.Offset.Max, spec.Offset.Nominal, spec.Offset.Step));
        Assert.Equal(0.500, spec.Target.OffsetVolts);
        Assert.Equal(0.010, spec.Target.SlopeVoltsPerC);
    }

    [Fact]
    public void ReferenceVolts_Ctp40A_PutsNominalPartNearHalfVoltAtZero()
    {
        var design = SimulatedUnitDesign.Ctp40A;
        var forwardAtZero = design.NominalDiode().ForwardVolts(0, design.BiasCurrentAmps);

        var outputAtZero = design.DesignGain * (design.ReferenceVolts - forwardAtZero);

        Assert.Equal(0.5, outputAtZero, 0.01);
    }

    [Fact]
    public void GainRange_Ctp40A_CoversPartSpreadOfSlope()
    {
        // The gain DAC spans ±2048 × 0.01 % ≈ ±20 %, far more than the ±3 % gain and ±5 % diode-slope spread.
        var design = SimulatedUnitDesign.Ctp40A;

        Assert.True((design.CodeMax - design.CodeNominal) * design.GainStepPerCode > 0.2);
        Assert.True((design.CodeNominal - design.CodeMin) * design.OffsetStepVolts > 1.0);
    }

    [Fact]
    public void ForProduct_DemoProducts_MapToTheirDesigns()
    {
        Assert.Same(SimulatedUnitDesign.Ctp40A, SimulatedUnitDesign.ForProduct("CTP-40A"));
        Assert.Same(SimulatedUnitDesign.Ctp40R, SimulatedUnitDesign.ForProduct("CTP-40R"));
        Assert.Same(SimulatedUnitDesign.Ctp40D, SimulatedUnitDesign.ForProduct("CTP-40D"));
        Assert.Null(SimulatedUnitDesign.ForProduct("CTP-40X"));
        Assert.Equal(3, SimulatedUnitDesign.Demo.Select(d => d.SerialPrefix).Distinct().Count());
    }

    [Fact]
    public void ToResistorTrimSpec_Ctp40R_IsSoundAndCarriesTheNetwork()
    {
        var spec = SimulatedUnitDesign.Ctp40R.ToResistorTrimSpec();

        Assert.Empty(spec.Check());
        Assert.Equal(("R7", 10_000.0, 10_000.0), (spec.Gain.Position, spec.Gain.FeedbackOhms, spec.Gain.FittedOhms!.Value));
        Assert.Equal(("R8", 2.5, 71_500.0), (spec.Offset.Position, spec.Offset.ReferenceVolts, spec.Offset.FittedOhms!.Value));
    }

    [Fact]
    public void ToFirmwareTrimSpec_Ctp40D_IsSoundForBothOrders()
    {
        Assert.Empty(SimulatedUnitDesign.Ctp40D.ToFirmwareTrimSpec(1).Check());
        Assert.Empty(SimulatedUnitDesign.Ctp40D.ToFirmwareTrimSpec(2).Check());
    }

    [Fact]
    public void FactoryCoefficientRegisters_NominalPart_ReportsWithinATenthOfADegreeAtItsTwoPoints()
    {
        // The factory line goes through the nominal part's readings at 0 and 40 °C; between them only the diode's
        // curvature (well under 0.5 °C) remains.
        var design = SimulatedUnitDesign.Ctp40D;
        var registers = design.FactoryCoefficientRegisters();
        var diode = design.NominalDiode();
        double Reported(double celsius)
        {
            var raw = diode.ForwardVolts(celsius, design.BiasCurrentAmps) / design.AdcReferenceVolts * (1L << design.AdcBits);
            var c = design.CoefficientRegisters.Select(r => r.Dequantise(registers[r.Register])).ToArray();
            return c[0] + (c[1] * raw) + (c[2] * raw * raw);
        }

        Assert.Equal(0.0, Reported(0), 0.01);
        Assert.Equal(40.0, Reported(40), 0.01);
        Assert.InRange(Reported(20) - 20, -0.5, 0.5);
    }
}
