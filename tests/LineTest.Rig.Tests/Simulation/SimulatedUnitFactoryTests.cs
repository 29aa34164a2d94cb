using System.Text.RegularExpressions;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedUnitFactoryTests
{
    private static readonly SimulatedUnitDesign Design = SimulatedUnitDesign.Ctp40A;

    [Fact]
    public void NextUnit_SameSeed_IdenticalUnits()
    {
        var a = SimulatedFixtures.Factory(seed: 42);
        var b = SimulatedFixtures.Factory(seed: 42);

        for (var i = 0; i < 100; i++)
        {
            var ua = a.NextUnit();
            var ub = b.NextUnit();
            Assert.Equal(ua.Serial, ub.Serial);
            Assert.Equal(ua.Parameters, ub.Parameters);
            Assert.Equal(ua.Defect, ub.Defect);
            Assert.Equal(ua.SampleOutputVolts(), ub.SampleOutputVolts());
        }
    }

    [Fact]
    public void NextUnit_DifferentSeeds_DifferentParts()
    {
        var a = SimulatedFixtures.Factory(seed: 1).NextUnit();
        var b = SimulatedFixtures.Factory(seed: 2).NextUnit();

        Assert.NotEqual(a.Parameters, b.Parameters);
    }

    [Fact]
    public void NextUnit_Serials_FollowDocumentedFormatAndCount()
    {
        var factory = new SimulatedUnitFactory(1, SimulatedFixtures.Simulation(), Design, yearWeek: 2612, firstCounter: 123);

        var first = factory.NextUnit();
        var second = factory.NextUnit(UnitDefect.Silent);

        Assert.Equal("CTP40A-2612-000123", first.Serial);
        Assert.Equal("CTP40A-2612-000124", second.Serial);
        Assert.Matches(new Regex(Design.SerialPattern), first.Serial);
    }

    [Theory]
    [InlineData("CTP40A-2612-000123", true)]
    [InlineData("CTP40A-2653-999999", true)]
    [InlineData("CTP40A-2654-000001", false)]
    [InlineData("CTP40A-2600-000001", false)]
    [InlineData("CTP40A-2612-00012", false)]
    [InlineData("CTP40B-2612-000123", false)]
    [InlineData("xCTP40A-2612-000123", false)]
    public void SerialPattern_Candidates_MatchOnlyValidSerials(string serial, bool valid)
    {
        Assert.Equal(valid, Regex.IsMatch(serial, Design.SerialPattern));
    }

    [Fact]
    public void NextUnit_ManyUnits_DefectShareNearRateAndAllKindsOccur()
    {
        var factory = SimulatedFixtures.Factory(seed: 8, simulation: SimulatedFixtures.Simulation(defectRate: 0.04));

        var defects = Enumerable.Range(0, 20_000).Select(_ => factory.NextUnit().Defect).ToList();

        // Binomial: σ = √(0.04·0.96/20000) ≈ 0.0014, so ±0.006 is over 4σ.
        var share = defects.Count(d => d != UnitDefect.None) / 20_000.0;
        Assert.Equal(0.04, share, 0.006);
        Assert.All(new[] { UnitDefect.OpenSensor, UnitDefect.StuckDac, UnitDefect.Silent }, kind => Assert.InRange(defects.Count(d => d == kind), 180, 360));
    }

    [Fact]
    public void NextUnit_ZeroDefectRate_NoDefects()
    {
        var factory = SimulatedFixtures.Factory(seed: 8, simulation: SimulatedFixtures.Simulation(defectRate: 0, sensorDefectRate: 0));

        Assert.All(Enumerable.Range(0, 2000).Select(_ => factory.NextUnit()), u => Assert.Equal(UnitDefect.None, u.Defect));
    }

    [Fact]
    public void NextUnit_ManyParts_SpreadsStayWithinDesignLimits()
    {
        var factory = SimulatedFixtures.Factory(seed: 17);
        // Parts with a sensor defect are built outside the design's limits on purpose.
        var parts = Enumerable.Range(0, 3000).Select(_ => factory.NextUnit())
            .Where(u => u.Defect is not (UnitDefect.HighSeriesResistance or UnitDefect.LeakyJunction or UnitDefect.WrongPart))
            .Select(u => u.Parameters).ToList();

        Assert.All(parts, p =>
        {
            Assert.InRange(p.DesignGain, 5.0 * 0.97, 5.0 * 1.03);
            Assert.InRange(p.InputOffsetVolts, -0.005, 0.005);
            Assert.InRange(p.GainStepPerCode, 0.0001 * 0.995, 0.0001 * 1.005);
            Assert.InRange(p.OffsetStepVolts, 0.0005 * 0.995, 0.0005 * 1.005);
            Assert.InRange(p.Diode.Ideality, 1.0, 1.1);
            Assert.True(p.LagTimeConstantSeconds > 0);
        });

        // 1σ of the gain is 1.5 %: the sample's spread must show it (truncation at ±2σ trims it to about 1.3 %).
        var gains = parts.Select(p => p.DesignGain / 5.0).ToList();
        var mean = gains.Average();
        var sd = Math.Sqrt(gains.Sum(g => (g - mean) * (g - mean)) / (gains.Count - 1));
        Assert.InRange(sd, 0.011, 0.0145);
        Assert.InRange(parts.Average(p => p.SupplyCurrentAmps), 0.00249, 0.00251);
    }

    [Fact]
    public void NextUnit_SensorDefectRate_DrawsEachSensorDefectRarely()
    {
        var factory = SimulatedFixtures.Factory(seed: 5, simulation: SimulatedFixtures.Simulation(defectRate: 0, sensorDefectRate: 0.05));
        var units = Enumerable.Range(0, 3000).Select(_ => factory.NextUnit()).ToList();

        // 5 % of 3000 = 150 expected; binomial σ ≈ 12, so 100…200 is far outside chance.
        Assert.InRange(units.Count(u => u.Defect != UnitDefect.None), 100, 200);
        Assert.All(units.Where(u => u.Defect == UnitDefect.HighSeriesResistance), u => Assert.InRange(u.Parameters.Diode.SeriesResistanceOhms, 300, 800));
        Assert.All(units.Where(u => u.Defect == UnitDefect.LeakyJunction), u => Assert.InRange(u.Parameters.Diode.ShuntOhms!.Value, 30e3, 150e3));
        Assert.All(units.Where(u => u.Defect == UnitDefect.WrongPart), u => Assert.InRange(u.Parameters.Diode.Ideality, 1.4, 1.7));
        Assert.All(units.Where(u => u.Defect == UnitDefect.None), u => Assert.Null(u.Parameters.Diode.ShuntOhms));
        Assert.Contains(units, u => u.Defect == UnitDefect.HighSeriesResistance);
        Assert.Contains(units, u => u.Defect == UnitDefect.LeakyJunction);
        Assert.Contains(units, u => u.Defect == UnitDefect.WrongPart);
    }

    [Fact]
    public void NextUnit_SensorDefects_LeaveGoodPartsAsTheyWere()
    {
        // Sensor defects come from each part's own stream after its other draws: switching them on changes no good part.
        var without = SimulatedFixtures.Factory(seed: 21, simulation: SimulatedFixtures.Simulation(sensorDefectRate: 0));
        var with = SimulatedFixtures.Factory(seed: 21, simulation: SimulatedFixtures.Simulation(sensorDefectRate: 0.2));

        for (var i = 0; i < 300; i++)
        {
            var a = without.NextUnit();
            var b = with.NextUnit();
            Assert.Equal(a.Serial, b.Serial);
            if (b.Defect == a.Defect)
            {
                Assert.Equal(a.Parameters, b.Parameters);
            }
        }
    }

    [Fact]
    public void NextUnit_ForcedDefect_DoesNotShiftFollowingParts()
    {
        var a = SimulatedFixtures.Factory(seed: 3);
        var b = SimulatedFixtures.Factory(seed: 3);

        a.NextUnit();
        var forced = b.NextUnit(UnitDefect.StuckDac);

        Assert.Equal(UnitDefect.StuckDac, forced.Defect);
        Assert.Equal(a.NextUnit().Parameters, b.NextUnit().Parameters);
    }

    [Theory]
    [InlineData(2600)]
    [InlineData(2654)]
    [InlineData(-1)]
    [InlineData(10_001)]
    public void Constructor_BadYearWeek_Throws(int yearWeek)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new SimulatedUnitFactory(1, SimulatedFixtures.Simulation(), Design, yearWeek));
    }

    [Fact]
    public void Constructor_DefectRateAboveOne_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new SimulatedUnitFactory(1, SimulatedFixtures.Simulation(defectRate: 1.5), Design));
    }

    [Fact]
    public void NextUnit_ManyParts_SpreadXtiBandGapAndNonLinearityAsDesigned()
    {
        var design = SimulatedUnitDesign.Ctp40D;
        var factory = SimulatedFixtures.Factory(seed: 5, design: design);
        var parts = Enumerable.Range(0, 600).Select(_ => factory.NextUnit(UnitDefect.None).Parameters).ToList();

        // Normal draws truncated at ±2σ keep a standard deviation of about 0.88σ [derived: √(1 − 2·2·φ(2)/(2Φ(2) − 1))].
        static (double Mean, double Sd) Stats(IReadOnlyList<double> v)
        {
            var mean = v.Average();
            return (mean, Math.Sqrt(v.Sum(x => (x - mean) * (x - mean)) / (v.Count - 1)));
        }

        var xti = Stats(parts.Select(p => p.Diode.Xti).ToList());
        var eg = Stats(parts.Select(p => p.Diode.BandGapElectronVolts).ToList());
        var beta = Stats(parts.Select(p => p.NonLinearityPerVolt).ToList());
        Assert.InRange(xti.Mean, 2.99, 3.01);
        Assert.InRange(xti.Sd / design.XtiSpread, 0.8, 0.96);
        Assert.InRange(eg.Sd / design.BandGapSpreadElectronVolts, 0.8, 0.96);
        Assert.InRange(beta.Mean, -0.0005, 0.0005);
        Assert.InRange(beta.Sd / design.NonLinearitySpreadPerVolt, 0.8, 0.96);
        Assert.All(parts, p => Assert.InRange(p.Diode.Xti, 3 - (2 * design.XtiSpread), 3 + (2 * design.XtiSpread)));
    }
}
