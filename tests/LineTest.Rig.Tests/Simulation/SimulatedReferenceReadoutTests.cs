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

    [Fact]
    public async Task ReadRawAsync_WithASensorLag_TrailsARampBySlopeTimesLag()
    {
        // [derived] a first-order lag τ behind an input rising at r trails it by r·τ once several τ have passed
        // (y = x − r·τ + (y0 − x0 + r·τ)·e^(−t/τ)). The block ramps at 10 °C/min from 23 °C to 80 °C; a 5 s sensor lag
        // reads 10/60 × 5 = 0.833 °C below the well after 60 s of ramp, the lag-free readout reads the well.
        var clock = SimulatedFixtures.Clock();
        var block = new SimulatedDryBlock(SimulatedFixtures.Source(), SimulatedFixtures.Simulation(blockNoiseC: 0), clock, 1);
        var lagging = new SimulatedReferenceReadout(block, c => c, resolution: 0, clock, seed: 2, noiseC: 0, lagSeconds: 5);
        var direct = new SimulatedReferenceReadout(block, c => c, resolution: 0, clock, seed: 3, noiseC: 0);
        await block.SetSetpointAsync(80, None);
        for (var t = 0; t < 60; t += 2)
        {
            clock.Advance(TimeSpan.FromSeconds(2));
            await lagging.ReadRawAsync(None);
        }

        var well = await direct.ReadRawAsync(None);
        var sensed = await lagging.ReadRawAsync(None);

        Assert.Equal(block.TrueTemperatureC(), well, 9);
        Assert.Equal(10.0 / 60 * 5, well - sensed, 4);
    }
}
