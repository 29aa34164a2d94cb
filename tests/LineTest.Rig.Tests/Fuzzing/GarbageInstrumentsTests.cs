using LineTest.Core.Fixtures;
using LineTest.Rig.Fuzzing;
using LineTest.Rig.Simulation;
using LineTest.TestSupport;

namespace LineTest.Rig.Tests.Fuzzing;

public sealed class GarbageInstrumentsTests
{
    [Fact]
    public void Instruments_SourceMeterMissedWhenAdded_PassesEveryInstrumentOn()
    {
        // The source-measure unit was added to the instrument set without its garbage twin: fuzz campaigns then faulted
        // at the first iv-sweep and never reached trim or verify. Every instrument of the set must come through.
        var inner = SimulatedInstruments();
        Assert.Empty(InstrumentSetChecks.Missing(inner));

        var garbage = new GarbageInstruments(inner, seed: 1, rate: 0.5);

        Assert.Empty(InstrumentSetChecks.Dropped(inner, garbage.Instruments));
    }

    [Fact]
    public async Task Instruments_RateZero_ForwardsSourceMeterReadings()
    {
        var inner = SimulatedInstruments();
        var garbage = new GarbageInstruments(inner, seed: 1, rate: 0);
        var smu = garbage.Instruments.SourceMeter!;

        await smu.SetCurrentAsync(1, 1e-5, 2.5, CancellationToken.None);
        var reading = await smu.MeasureVoltsAsync(CancellationToken.None);
        await smu.OutputOffAsync(CancellationToken.None);

        // An empty slot is an open circuit: the simulated SMU hits its compliance, and the wrapper passes that on untouched.
        Assert.True(reading.InCompliance);
        Assert.Equal(0, garbage.GarbageReplies);
    }

    private static Rig.Instruments.RigInstruments SimulatedInstruments()
    {
        var fixture = FixtureLoader.LoadFile(RepoFiles.Path("fixtures/sim-dryblock-4.json")).Value!;
        var clock = new VirtualTimeProvider(new DateTimeOffset(2026, 12, 2, 6, 0, 0, TimeSpan.Zero));
        return new SimulatedRig(fixture, 7, clock, c => 100 * (1 + 0.00385 * c)).Instruments;
    }
}
