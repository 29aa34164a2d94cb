using LineTest.Core.Results;
using LineTest.Rig.Serial.Source;
using LineTest.Rig.Simulation;
using LineTest.TestSupport;

namespace LineTest.Rig.Serial.Tests.Twins;

/// <summary>The real coordinator driving the simulated rig through the real drivers over pseudo-terminal ports.</summary>
public sealed class SimulatedSerialRigTests
{
    [LinuxFact]
    public async Task RunBatch_OverSerial_SameVerdictsAndTrimsAsInMemory()
    {
        // Same seed, same units: every value crosses the ports exactly, so the outcome must not change.
        var defects = new[] { UnitDefect.None, UnitDefect.StuckDac, UnitDefect.None, UnitDefect.OpenSensor };
        using var serial = new SerialHarness(seed: 21);
        var serialOutcome = await serial.RunBatchAsync(serial.Load(defects));
        using var memory = new SerialHarness(seed: 21);
        var memoryOutcome = await memory.RunBatchAsync(memory.Load(defects), inMemory: true);

        Assert.Equal(
            memoryOutcome.Runs.Select(r => (r.Serial, r.Verdict, Trim(r))),
            serialOutcome.Runs.Select(r => (r.Serial, r.Verdict, Trim(r))));
        Assert.Contains(serialOutcome.Runs, r => r.Verdict == Verdict.Pass);
        Assert.Contains(serialOutcome.Runs, r => r.Verdict == Verdict.Fail);
    }

    [LinuxFact]
    public async Task RunBatch_UnitStopsAnsweringMidRun_ThatUnitErrorsWithPortAndOthersFinish()
    {
        using var h = new SerialHarness(unitTimeoutMs: 200);
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None);
        h.Rig.InjectFault(RigFault.UnitSilent(slot: 2, afterCommands: 3));

        var outcome = await h.RunBatchAsync(units);

        Assert.True(outcome.Aborted is null, outcome.Aborted + "\n" + h.Log);
        var silent = outcome.Runs.Single(r => r.Slot == 2);
        Assert.Equal(Verdict.Error, silent.Verdict);
        Assert.Contains("does not answer", silent.Reason, StringComparison.Ordinal);
        Assert.Contains(h.Serial.Units[2].Server.PortName, silent.Reason, StringComparison.Ordinal);
        Assert.All(outcome.Runs.Where(r => r.Slot != 2), r => Assert.Equal(Verdict.Pass, r.Verdict));
    }

    [LinuxFact]
    public async Task RunBatch_UnitGarbled_ThatUnitErrorsNeverPasses()
    {
        using var h = new SerialHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.None);
        h.Rig.InjectFault(RigFault.UnitGarbage(slot: 1, afterCommands: 1));

        var outcome = await h.RunBatchAsync(units);

        var garbled = outcome.Runs.Single(r => r.Slot == 1);
        Assert.Equal(Verdict.Error, garbled.Verdict);
        Assert.Contains("could not be understood", garbled.Reason, StringComparison.Ordinal);
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 2).Verdict);
    }

    [LinuxFact]
    public async Task RunBatch_SourceSilent_AllUnitsErrorAndStandbyIsSent()
    {
        using var h = new SerialHarness(timeouts: new() { ["source"] = 200 });
        var units = h.Load(UnitDefect.None, UnitDefect.None);
        h.Rig.InjectFault(RigFault.SourceSilent(afterCommands: 1));

        var outcome = await h.RunBatchAsync(units);

        Assert.NotNull(outcome.Aborted);
        Assert.All(outcome.Runs, r =>
        {
            Assert.Equal(Verdict.Error, r.Verdict);
            Assert.Contains("temperature source lost", r.Reason, StringComparison.Ordinal);
            Assert.Contains("no answer within 200 ms", r.Reason, StringComparison.Ordinal);
        });
        Assert.Equal(SourceCommands.Standby, h.Serial.Source.Server.Received[^1]);
    }

    [LinuxFact]
    public async Task RunBatch_SourceHeaterFault_ErrorReplyStopsBatchAndStandbyIsSent()
    {
        using var h = new SerialHarness();
        var units = h.Load(UnitDefect.None);
        h.Rig.InjectFault(RigFault.SourceHeaterFault());

        var outcome = await h.RunBatchAsync(units);

        var run = Assert.Single(outcome.Runs);
        Assert.Equal(Verdict.Error, run.Verdict);
        Assert.Contains("heater fault", run.Reason, StringComparison.Ordinal);
        Assert.Equal(SourceCommands.Standby, h.Serial.Source.Server.Received[^1]);
    }

    [LinuxFact]
    public async Task RunBatch_MeterPortLostMidBatch_AllUnitsErrorAndSourceGoesToStandby()
    {
        using var h = new SerialHarness(timeouts: new() { ["meter"] = 200 });
        var units = h.Load(UnitDefect.None, UnitDefect.None);
        h.Rig.InjectFault(RigFault.MeterPortLost(afterCommands: 40));

        var outcome = await h.RunBatchAsync(units);

        Assert.NotNull(outcome.Aborted);
        Assert.All(outcome.Runs, r =>
        {
            Assert.Equal(Verdict.Error, r.Verdict);
            Assert.Contains("voltmeter lost", r.Reason, StringComparison.Ordinal);
            Assert.Contains(h.Serial.Meter.Server.PortName, r.Reason, StringComparison.Ordinal);

        });
        Assert.Equal(h.Fixture.Source.StandbyC, h.Rig.Block.SetpointC);
        Assert.Equal(SourceCommands.Standby, h.Serial.Source.Server.Received[^1]);
    }

    [LinuxFact]
    public async Task RunBatch_ReferenceSilent_AllUnitsErrorNamingTheReference()
    {
        using var h = new SerialHarness(timeouts: new() { ["reference"] = 200 });
        var units = h.Load(UnitDefect.None);
        h.Rig.InjectFault(RigFault.ReferenceSilent(afterCommands: 10));

        var outcome = await h.RunBatchAsync(units);

        var run = Assert.Single(outcome.Runs);
        Assert.Equal(Verdict.Error, run.Verdict);
        Assert.Contains("reference thermometer lost", run.Reason, StringComparison.Ordinal);
        Assert.Equal(SourceCommands.Standby, h.Serial.Source.Server.Received[^1]);
    }

    private static string Trim(RunRecord run)
        => run.Trim is null ? "-" : string.Join(",", run.Trim.Values.OrderBy(p => p.Key).Select(p => $"{p.Key}={p.Value}"));

    [LinuxFact]
    public void Instruments_EveryInstrumentOfTheSimulatedRig_PassedOnOverSerial()
    {
        // A wrapper of the instrument set must pass every instrument on (the garbage wrapper once dropped the
        // source-measure unit); the serial twins are such a wrapper.
        using var h = new SerialHarness();

        Assert.Empty(InstrumentSetChecks.Missing(h.Rig.Instruments));
        Assert.Empty(InstrumentSetChecks.Dropped(h.Rig.Instruments, h.Serial.Instruments));
    }
}
