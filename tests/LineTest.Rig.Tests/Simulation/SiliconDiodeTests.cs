using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SiliconDiodeTests
{
    private const double BiasAmps = 10e-6;

    [Theory]
    [InlineData(300.0, 0.025852)]
    [InlineData(298.15, 0.025693)]
    public void ThermalVolts_AtPublishedTemperatures_MatchesKtOverQ(double kelvin, double expectedVolts)
    {
        // SI 2019 exact k = 1.380649e-23 J/K and e = 1.602176634e-19 C [published constants];
        // kT/q = 25.852 mV at 300 K, 25.693 mV at 298.15 K [derived voltages].
        Assert.Equal(expectedVolts, SiliconDiode.ThermalVolts(kelvin), 0.0000005);
    }

    [Fact]
    public void NominalDiode_At25C_HasDesignForwardVoltage()
    {
        var diode = SimulatedUnitDesign.Ctp40A.NominalDiode();

        Assert.Equal(0.600, diode.ForwardVolts(25, BiasAmps), 12);
    }

    [Fact]
    public void ForwardVolts_SolvedBackThroughShockley_RecoversBiasCurrent()
    {
        // Shockley with series resistance: I = I_s(T)·(exp((V − I·R_s)/(n·V_T)) − 1) [from memory].
        var diode = new SiliconDiode(3e-15, 1.07, 25);
        foreach (var celsius in new[] { -40.0, 0.0, 25.0, 85.0 })
        {
            var kelvin = celsius + 273.15;
            var volts = diode.ForwardVolts(celsius, BiasAmps);
            var current = diode.SaturationCurrentAmps(kelvin) * (Math.Exp((volts - (BiasAmps * 25)) / (1.07 * SiliconDiode.ThermalVolts(kelvin))) - 1);
            Assert.Equal(BiasAmps, current, 1e-15);
        }
    }

    [Fact]
    public void SaturationCurrentAmps_AtT0_IsTheParameter()
    {
        var diode = new SiliconDiode(2.5e-15, 1.02, 10);

        Assert.Equal(2.5e-15, diode.SaturationCurrentAmps(SiliconDiode.ReferenceKelvin), 1e-27);
    }

    [Fact]
    public void SaturationCurrentAmps_TenKelvinWarmer_RisesSeveralFold()
    {
        // I_s of a silicon junction roughly doubles every 5 K near room temperature [common practice],
        // so 10 K gives about 4×: check it lies between 3× and 6×.
        var diode = SimulatedUnitDesign.Ctp40A.NominalDiode();

        var ratio = diode.SaturationCurrentAmps(310.15) / diode.SaturationCurrentAmps(300.15);

        Assert.InRange(ratio, 3, 6);
    }

    [Fact]
    public void ForwardVolts_ManySeededParts_SlopeBetween0And50CIsAboutMinus2MillivoltsPerDegree()
    {
        // A silicon diode's forward voltage at constant current falls by about 2 mV/°C; −1.8…−2.4 mV/°C [common practice].
        var factory = SimulatedFixtures.Factory(seed: 2024);
        for (var i = 0; i < 500; i++)
        {
            var diode = factory.NextUnit().Parameters.Diode;
            var slope = (diode.ForwardVolts(50, BiasAmps) - diode.ForwardVolts(0, BiasAmps)) / 50;
            Assert.InRange(slope, -0.0024, -0.0018);
        }
    }

    [Fact]
    public void ForwardVolts_ZeroCurrent_Throws()
    {
        var diode = SimulatedUnitDesign.Ctp40A.NominalDiode();

        Assert.Throws<ArgumentOutOfRangeException>(() => diode.ForwardVolts(25, 0));
    }

    [Fact]
    public void WithForwardVolts_BelowSeriesDrop_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => SiliconDiode.WithForwardVolts(0.0001, 25, BiasAmps, 1.05, 20));
    }

    [Theory]
    [InlineData(3.0, 1.12)]
    [InlineData(3.2, 1.10)]
    public void ForwardVolts_OwnXtiAndBandGap_FollowsTheClosedFormOfTheDiodeTemperatureModel(double xti, double bandGap)
    {
        // V_f(T) − I·R_s = (T/T1)·V_j(T1) + EG·(1 − T/T1) − XTI·(n·k·T/q)·ln(T/T1) for I_s ∝ T^XTI·exp(−EG/(n·k·T))
        // (semiconductor-device textbooks; the SPICE diode model with XTI_SPICE = n·XTI [from memory]); the Shockley
        // "+1" changes V_f by n·V_T·I_s/I, about a nanovolt here.
        var diode = SiliconDiode.WithForwardVolts(0.6, 25, BiasAmps, 1.05, 20) with { Xti = xti, BandGapElectronVolts = bandGap };
        var drop = BiasAmps * 20;
        var t1 = 298.15;
        var junctionAtT1 = diode.ForwardVolts(25, BiasAmps) - drop;

        foreach (var celsius in new[] { -30.0, -20, 5, 40, 60 })
        {
            var expected = Core.Characterisation.DiodeTemperatureModel.ForwardVolts(celsius + 273.15, t1, junctionAtT1, bandGap, xti, 1.05);
            Assert.InRange(diode.ForwardVolts(celsius, BiasAmps) - drop - expected, -3e-9, 3e-9);
        }
    }
}
