using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;
using LineTest.Core.Throughput;

namespace LineTest.Core.Tests.Throughput;

public sealed class ThermalBoundTests
{
    [Fact]
    public void Compute_SequenceWithIvSweeps_TimeEstimateIgnoredTheSweeps()
    {
        // The bound once counted measure and verify steps only, so a sequence with I–V sweeps looked faster than it can
        // be. [derived] The shipped DAC sequence sweeps 7 currents, 1 sample, at cal-low and cal-high: for 4 units at
        // 1 s per reference and 0.2 s per reading each sweep adds 4 × (2 × 1 + 7 × 0.2) = 13.6 s to its setpoint's leg.
        var fixture = FixtureLoader.Load(TestFiles.ShippedFixturePath, File.ReadAllBytes(TestFiles.ShippedFixturePath)).Value!;
        var sequence = SequenceLoader.Load(TestFiles.ShippedSequencePath, File.ReadAllBytes(TestFiles.ShippedSequencePath), fixture).Value!;
        var withoutSweeps = sequence with { Steps = sequence.Steps.Where(s => s is not IvSweepStep).ToList() };
        Assert.Equal(2, sequence.Steps.Count(s => s is IvSweepStep));

        var bound = ThermalBound.Compute(sequence, fixture.Source, fixture.Source.StandbyC, 4, 1.0, 0.2);
        var boundWithout = ThermalBound.Compute(withoutSweeps, fixture.Source, fixture.Source.StandbyC, 4, 1.0, 0.2);

        Assert.Equal(2 * 13.6, bound.BatchSeconds - boundWithout.BatchSeconds, 6);
    }

    [Fact]
    public void Compute_PredictiveSetpoint_IsTheRampPlusOneTimeConstantWithNoWindowOrSoak()
    {
        // [derived] the shipped fixture ramps 15 °C/min up with τ = 40 s, so its first-order approach begins rτ = 10 °C
        // short of the setpoint: from 23 °C to +40 °C the ramp takes (17 − 10)/0.25 = 28 s. The predictive fit needs its
        // readings to cover one τ of the approach (PredictiveSettle.MinimumTimeConstantsCovered), so the leg's travel is
        // 28 + 40 = 68 s, with no stability window and no soak; the window leg waits until the band (τ·ln(rτ/band)).
        var fixture = FixtureLoader.Load(TestFiles.ShippedFixturePath, File.ReadAllBytes(TestFiles.ShippedFixturePath)).Value!;
        var sequence = SequenceLoader.Load(TestFiles.ShippedSequencePath, File.ReadAllBytes(TestFiles.ShippedSequencePath), fixture).Value!;
        var predictive = SettleSettings.ForAll(sequence, new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.01 });
        var high = sequence.Setpoints.Single(s => s.Name == "cal-high");
        var only = sequence with { Steps = sequence.Steps.Where(s => s is SettleStep { Setpoint: "cal-high" }).ToList() };

        var window = ThermalBound.Compute(only, fixture.Source, 23, 4, 1.0, 0.2).Legs.Single();
        var leg = ThermalBound.Compute(predictive with { Steps = only.Steps }, fixture.Source, 23, 4, 1.0, 0.2).Legs.Single();

        Assert.Equal(40, high.Celsius);
        Assert.Equal(28, ThermalBound.RampSeconds(fixture.Source, 23, 40), 9);
        Assert.Equal(28 + 40, leg.TravelSeconds, 9);
        Assert.Equal(0, leg.StableWindowSeconds);
        Assert.Equal(0, leg.SoakSeconds);
        Assert.Equal(28 + (40 * Math.Log(10 / sequence.Stability.BandC)), window.TravelSeconds, 9);
        Assert.True(window.TotalSeconds > leg.TotalSeconds);
    }
}
