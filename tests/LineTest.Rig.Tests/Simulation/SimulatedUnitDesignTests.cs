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
}
