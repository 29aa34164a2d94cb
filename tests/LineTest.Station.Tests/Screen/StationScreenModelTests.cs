using LineTest.Core.Results;
using LineTest.Core.Units;
using LineTest.Factory.Forwarding;
using LineTest.Station.Screen;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Station.Tests.Screen;

public sealed class StationScreenModelTests
{
    private readonly FakeTimeProvider _time = new(new DateTimeOffset(2026, 12, 2, 8, 0, 0, TimeSpan.Zero));

    public static TheoryData<UnitState, string> StateWordsData => new()
    {
        { UnitState.Loaded, "loaded" },
        { UnitState.Identifying, "identifying" },
        { UnitState.CheckingSupply, "checking supply" },
        { UnitState.WaitingForSource, "waiting for block" },
        { UnitState.Soaking, "soaking" },
        { UnitState.Measuring, "measuring" },
        { UnitState.Trimming, "trimming" },
        { UnitState.Verifying, "verifying" },
        { UnitState.AwaitingOperator, "waiting for you" },
        { UnitState.Passed, "done" },
        { UnitState.Failed, "done" },
        { UnitState.Errored, "stopped" },
    };

    [Theory]
    [MemberData(nameof(StateWordsData))]
    public void Snapshot_EverySlotState_ShowsPlainWords(UnitState state, string words)
    {
        var model = Model();
        model.UnitChanged(2, "CTP40A-2612-000002", state, "settle", 2, 9);

        var slot = model.Snapshot().Slots.Single(s => s.Slot == 2);

        Assert.Equal(state, slot.State);
        Assert.Equal(words, StateWords.Of(slot.State));
        var line = ScreenRenderer.PlainLines(model.Snapshot()).Single(l => l.StartsWith("slot 2", StringComparison.Ordinal));
        Assert.Contains(words, line, StringComparison.Ordinal);
    }

    [Fact]
    public void Snapshot_EmptySlot_SaysEmpty()
    {
        Assert.Equal("empty", StateWords.Of(Model().Snapshot().Slots[0].State));
    }

    [Theory]
    [InlineData(Verdict.Pass, "PASS")]
    [InlineData(Verdict.Fail, "FAIL")]
    [InlineData(Verdict.Error, "ERROR")]
    public void UnitFinished_ShowsVerdictWordAndReason(Verdict verdict, string word)
    {
        var model = Model();
        model.Loaded(1, "CTP40A-2612-000001", isRetest: false);

        model.UnitFinished(Run(1, verdict, verdict == Verdict.Pass ? null : "verify.error: 0.61 degC is above the acceptance limit"));

        var slot = model.Snapshot().Slots[0];
        Assert.Equal(verdict, slot.Verdict);
        Assert.Equal(1, slot.Progress);
        Assert.Contains(word, string.Join("\n", ScreenRenderer.PlainLines(model.Snapshot())), StringComparison.Ordinal);
    }

    [Fact]
    public void Prompt_IsShown()
    {
        var model = Model();

        model.Prompt("Fit 12.1 kΩ in position R7 of slot 3, then press Enter.");

        Assert.Equal("Fit 12.1 kΩ in position R7 of slot 3, then press Enter.", model.Snapshot().Prompt);
        Assert.Contains("> Fit 12.1 kΩ", ScreenRenderer.PlainLines(model.Snapshot())[^1], StringComparison.Ordinal);
    }

    [Fact]
    public void Notice_RefusedScan_ShownAboveThePromptUntilAUnitIsLoaded()
    {
        var model = Model();
        model.Prompt("Scan the serial for slot 1 (or type 'N SERIAL' for slot N).");

        model.Notice("Refused: a scan with the non-printable byte 0x7F at position 1.");
        var lines = ScreenRenderer.PlainLines(model.Snapshot());
        model.Loaded(1, "CTP40A-2612-000001", isRetest: false);

        Assert.Equal("! Refused: a scan with the non-printable byte 0x7F at position 1.", lines[^2]);
        Assert.StartsWith("> Scan the serial for slot 1", lines[^1], StringComparison.Ordinal);
        Assert.Null(model.Snapshot().Notice);
    }

    [Fact]
    public void Loaded_Retest_IsMarked()
    {
        var model = Model();

        model.Loaded(3, "CTP40A-2612-000003", isRetest: true);

        Assert.True(model.Snapshot().Slots.Single(s => s.Slot == 3).IsRetest);
    }

    [Theory]
    [InlineData(60.0, "HOT")]
    [InlineData(-20.0, "COLD")]
    [InlineData(23.0, null)]
    public void Caution_FollowsBlockTemperature(double celsius, string? expected)
    {
        var model = Model();

        model.SourceChanged(celsius, celsius, "stable");

        var caution = model.Snapshot().Caution;
        if (expected is null)
        {
            Assert.Null(caution);
        }
        else
        {
            Assert.StartsWith(expected, caution, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void TimeLeft_CountsDownWithinTheCurrentStepAndAddsTheRest()
    {
        var model = Model();
        model.UnitChanged(1, "CTP40A-2612-000001", UnitState.WaitingForSource, "settle", 1, 3);

        _time.Advance(TimeSpan.FromSeconds(40));

        // Steps expected: 10 s, 100 s, 50 s; 40 s into step 1 → 60 s + 50 s left.
        Assert.Equal(TimeSpan.FromSeconds(110), model.Snapshot().Slots[0].TimeLeft);
    }

    [Fact]
    public void UnloadAll_EmptiesEverySlot()
    {
        var model = Model();
        model.Loaded(1, "CTP40A-2612-000001", false);

        model.UnloadAll();

        Assert.All(model.Snapshot().Slots, s => Assert.Null(s.Serial));
    }

    private StationScreenModel Model() =>
        new(new ScreenHeader("ST-01", "Simulated four-well dry block", "ctp40a-dac", 1, "L-1", "A. Operator", "engineering"), [1, 2, 3, 4], [10, 100, 50], _time);

    private static RunRecord Run(int slot, Verdict verdict, string? reason) => new()
    {
        Id = Guid.NewGuid(),
        Serial = $"CTP40A-2612-00000{slot}",
        Product = "CTP-40A",
        SequenceId = "ctp40a-dac",
        SequenceRevision = 1,
        SequenceSha256 = new string('0', 64),
        Station = "ST-01",
        Fixture = "sim",
        Slot = slot,
        StartedUtc = DateTimeOffset.UnixEpoch,
        EndedUtc = DateTimeOffset.UnixEpoch,
        Verdict = verdict,
        Reason = reason,
    };

    [Fact]
    public void Snapshot_FactoryBacklog_ShowsTheForwardersLatestCountAndOldest()
    {
        var backlog = new SettableBacklog();
        var model = new StationScreenModel(new ScreenHeader("ST-01", "DB4", "ctp40a-dac", 1, null, null, "engineering"), [1, 2], [10.0], _time)
        {
            Factory = backlog,
        };

        Assert.Equal("factory: up to date", ScreenRenderer.PlainLines(model.Snapshot())[1]);

        backlog.Current = new FactoryBacklogStatus(3, new DateTimeOffset(2026, 12, 2, 7, 12, 0, TimeSpan.Zero), null, "connection refused", 2);

        Assert.Equal(3, model.Snapshot().Factory!.Count);
        Assert.Equal(
            "factory: 3 run(s) waiting since 2026-12-02 07:12 UTC (connection refused; attempt 2)",
            ScreenRenderer.PlainLines(model.Snapshot())[1]);
    }

    [Fact]
    public void Snapshot_NoFactory_NoBacklog()
    {
        var model = new StationScreenModel(new ScreenHeader("ST-01", "DB4", "ctp40a-dac", 1, null, null, "engineering"), [1], [10.0], _time);

        Assert.Null(model.Snapshot().Factory);
    }

    /// <summary>A backlog whose state the test sets, as the forwarding loop replaces it.</summary>
    private sealed class SettableBacklog : IFactoryBacklog
    {
        public FactoryBacklogStatus Current { get; set; } = FactoryBacklogStatus.Unknown;
    }
}
