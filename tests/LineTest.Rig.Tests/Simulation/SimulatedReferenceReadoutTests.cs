using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedReferenceReadoutTests
{
    private static readonly CancellationToken None = CancellationToken.None;

    [Fact]
    public async Task ReadRawAsync_SettledBlock_ReportsConversionOfWellTemperature()
    {
        var clock = SimulatedFixtures.Clock();
        var block = new SimulatedDryBlock(SimulatedFixtures.Source(), SimulatedFixtures.Simulation(blockNoiseC: 0), clock, 1);
        // An invented linear sensor, 1000 Ω + 4 Ω/°C: only the plumbing is under test here.
        var readout = new SimulatedReferenceReadout(block, c => 1000 + (4 * c), resolution: 0.001, clock, seed: 2, noiseC: 0);
        await block.SetSetpointAsync(-10, None);
        clock.Advance(TimeSpan.FromHours(2));

        var raw = await readout.ReadRawAsync(None);

        Assert.Equal(960.0, raw, 9);
    }

    [Fact]
    public async Task ReadRawAsync_WithResolution_RoundsToIt()
    {
        var clock = SimulatedFixtures.Clock();
        var block = new SimulatedDryBlock(SimulatedFixtures.Source(), SimulatedFixtures.Simulation(), clock, 1);
        var readout = new SimulatedReferenceReadout(block, c => 100 + (0.385 * c), resolution: 0.01, clock, seed: 2);

        for (var i = 0; i < 50; i++)
        {
            var steps = await readout.ReadRawAsync(None) / 0.01;
            Assert.Equal(Math.Round(steps), steps, 6);
        }
    }

    [Fact]
    public async Task ReadRawAsync_Noise_HasConfiguredSpreadInCelsius()
    {
        var clock = SimulatedFixtures.Clock();
        var block = new SimulatedDryBlock(SimulatedFixtures.Source(), SimulatedFixtures.Simulation(blockNoiseC: 0), clock, 1);
        var readout = new SimulatedReferenceReadout(block, c => c, resolution: 0, clock, seed: 2, noiseC: 0.001);

        var readings = new double[4000];
        for (var i = 0; i < readings.Length; i++)
        {
            readings[i] = await readout.ReadRawAsync(None);
        }

        var mean = readings.Average();
        var sd = Math.Sqrt(readings.Sum(r => (r - mean) * (r - mean)) / (readings.Length - 1));
        Assert.Equal(23.0, mean, 0.0001);
        Assert.InRange(sd, 0.0009, 0.0011);
    }

    [Fact]
    public void Constructor_NegativeResolution_Throws()
    {
        var clock = SimulatedFixtures.Clock();
        var block = new SimulatedDryBlock(SimulatedFixtures.Source(), SimulatedFixtures.Simulation(), clock, 1);

        Assert.Throws<ArgumentOutOfRangeException>(() => new SimulatedReferenceReadout(block, c => c, -0.1, clock, 1));
    }
}
