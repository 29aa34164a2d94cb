using LineTest.Core.Scanning;
using LineTest.Rig.Serial.Scanner;
using LineTest.Station.Hosting;
using LineTest.Station.Screen;
using LineTest.Storage.History;
using LineTest.TestSupport;
using Microsoft.Extensions.Logging.Abstractions;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Station.Tests.Hosting;

/// <summary>The operator dialogue: every input answered, in every state (regressions of issue 16, each named after what broke).</summary>
public sealed class OperatorDialogueTests
{
    private const string Pattern = "^CTP40A-[0-9]{4}-[0-9]{6}$";
    private readonly FakeTimeProvider _time = new(new DateTimeOffset(2026, 12, 3, 8, 0, 0, TimeSpan.Zero));
    private readonly StringWriter _plain = new();
    private readonly string _results = Some.TempDirectory();
    private StationScreenModel? _model;

    [Fact]
    public async Task TakeAsync_FirstKeyboardScanAfterBatchDone_IsLoadedNotDropped()
    {
        var dialogue = Dialogue(plain: false);
        await RunBatchAsync(dialogue, "CTP40A-2612-000001");

        await dialogue.TakeAsync(OperatorEntry.Typed("CTP40A-2612-000002"), default);

        Assert.Equal("CTP40A-2612-000002", Assert.Single(dialogue.Loads).Serial);
        Assert.Equal("CTP40A-2612-000002", _model!.Snapshot().Slots[0].Serial);
    }

    [Fact]
    public async Task TakeAsync_RefusedScanAfterBatchDone_IsAnswered()
    {
        var dialogue = Dialogue(plain: false);
        await RunBatchAsync(dialogue, "CTP40A-2612-000001");

        await dialogue.TakeAsync(OperatorEntry.Typed("CTP40B-1"), default);

        Assert.Empty(dialogue.Loads);
        Assert.StartsWith("Refused: 'CTP40B-1' is not a serial of this product", _model!.Snapshot().Notice, StringComparison.Ordinal);
    }

    [Fact]
    public async Task TakeAsync_BadSerial_RefusedWithTheExampleNotTheRawPattern()
    {
        var dialogue = Dialogue();

        await dialogue.TakeAsync(OperatorEntry.Typed("CTP40A-26-1"), default);

        var notice = _model!.Snapshot().Notice!;
        Assert.Contains("expected like CTP40A-2612-000123", notice, StringComparison.Ordinal);
        Assert.DoesNotContain("[0-9]", notice, StringComparison.Ordinal);
    }

    [Fact]
    public async Task TakeAsync_MisspeltCommandWhileLoading_AnsweredWithWhatIsAllowedNow()
    {
        var dialogue = Dialogue();

        await dialogue.TakeAsync(OperatorEntry.Typed("hsitory"), default);

        Assert.Contains("Now: scan a serial", _model!.Snapshot().Notice, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("cancel 9", "Refused: '9' is not a slot of this fixture")]
    [InlineData("cancel 3", "Refused: slot 3 is empty in this batch; nothing to cancel.")]
    public async Task TakeAsync_CancelUnknownOrEmptySlot_RefusedAtOnceWithoutAQuestion(string typed, string answer)
    {
        var dialogue = Dialogue();
        await StartAsync(dialogue, "CTP40A-2612-000001");

        var action = await dialogue.TakeAsync(OperatorEntry.Typed(typed), default);

        Assert.Equal(DialogueAction.None, action);
        Assert.Equal(DialogueState.Running, dialogue.State);
        Assert.StartsWith(answer, _model!.Snapshot().Notice, StringComparison.Ordinal);
    }

    [Fact]
    public async Task TakeAsync_CancelRunningSlotConfirmed_CancelsThatSlot()
    {
        var dialogue = Dialogue();
        await StartAsync(dialogue, "CTP40A-2612-000001");

        Assert.Equal(DialogueAction.None, await dialogue.TakeAsync(OperatorEntry.Typed("cancel 1"), default));
        Assert.Equal(DialogueState.ConfirmSlotCancel, dialogue.State);
        var action = await dialogue.TakeAsync(OperatorEntry.Typed("yes"), default);

        Assert.Equal(DialogueAction.CancelSlot, action);
        Assert.Equal(1, dialogue.SlotToCancel);
    }

    [Theory]
    [InlineData("cnacel", "Not understood: 'cnacel'. While the batch runs: cancel, cancel N, history SERIAL.")]
    [InlineData("CTP40A-2612-000005", "Refused: CTP40A-2612-000005 was scanned while a batch runs; scan it again when the batch is done.")]
    [InlineData("", "The batch is running; nothing to start.")]
    public async Task TakeAsync_TypedDuringBatch_NeverIgnored(string typed, string answer)
    {
        var dialogue = Dialogue();
        await StartAsync(dialogue, "CTP40A-2612-000001");

        await dialogue.TakeAsync(OperatorEntry.Typed(typed), default);

        Assert.StartsWith(answer, _model!.Snapshot().Notice, StringComparison.Ordinal);
    }

    [Fact]
    public async Task TakeAsync_ScannerCodeDuringBatch_Refused()
    {
        var dialogue = Dialogue();
        await StartAsync(dialogue, "CTP40A-2612-000001");

        await dialogue.TakeAsync(OperatorEntry.Scanned(ScanResult.Of("CTP40A-2612-000009")), default);

        Assert.Contains("was scanned while a batch runs", _model!.Snapshot().Notice, StringComparison.Ordinal);
    }

    [Fact]
    public void Interrupt_NoBatch_StopsAtOnce()
    {
        var dialogue = Dialogue();
        dialogue.Begin();

        Assert.Equal(DialogueAction.Stop, dialogue.Interrupt());
    }

    [Fact]
    public async Task Interrupt_BatchRunning_AsksThenStopsOnYes()
    {
        var dialogue = Dialogue();
        await StartAsync(dialogue, "CTP40A-2612-000001");

        Assert.Equal(DialogueAction.None, dialogue.Interrupt());
        Assert.Equal(DialogueState.ConfirmStop, dialogue.State);
        Assert.Equal(DialogueAction.Stop, await dialogue.TakeAsync(OperatorEntry.Typed("yes"), default));
    }

    [Fact]
    public async Task Begin_ProductionWithoutBadgeAndLot_RefusesUnitSerialsUntilBothAreScanned()
    {
        var dialogue = Dialogue(mode: "production");
        dialogue.Begin();
        Assert.Equal(DialogueState.Badge, dialogue.State);

        await dialogue.TakeAsync(OperatorEntry.Typed("CTP40A-2612-000001"), default);
        Assert.Contains("production needs the operator's badge and the lot", _model!.Snapshot().Notice, StringComparison.Ordinal);
        Assert.Empty(dialogue.Loads);
        Assert.Equal(DialogueAction.None, await dialogue.TakeAsync(OperatorEntry.Typed(string.Empty), default));

        await dialogue.TakeAsync(OperatorEntry.Typed("badge-0412"), default);
        Assert.Equal(DialogueState.Lot, dialogue.State);
        await dialogue.TakeAsync(OperatorEntry.Typed("CTP40A-2612-000001"), default);
        Assert.Equal(DialogueState.Lot, dialogue.State);
        await dialogue.TakeAsync(OperatorEntry.Typed("L-2612-07"), default);

        Assert.Equal(DialogueState.Loading, dialogue.State);
        Assert.Equal(("badge-0412", "L-2612-07"), (dialogue.Operator, dialogue.Lot));
    }

    [Fact]
    public async Task TakeAsync_Lot_ChangesTheLotForTheNextBatch()
    {
        var dialogue = Dialogue(lot: "L-1");
        dialogue.Begin();

        await dialogue.TakeAsync(OperatorEntry.Typed("lot"), default);
        await dialogue.TakeAsync(OperatorEntry.Typed("L-2"), default);

        Assert.Equal("L-2", dialogue.Lot);
        Assert.Equal(DialogueState.Loading, dialogue.State);
    }

    [Fact]
    public async Task TakeAsync_SlotOff_SkippedWhenScanningAndRecordedWithOperatorAndTime()
    {
        var dialogue = Dialogue(operatorName: "badge-0412");
        dialogue.Begin();

        await dialogue.TakeAsync(OperatorEntry.Typed("slot 1 off insert worn"), default);
        await dialogue.TakeAsync(OperatorEntry.Typed("CTP40A-2612-000001"), default);
        await dialogue.TakeAsync(OperatorEntry.Typed("1 CTP40A-2612-000002"), default);

        Assert.Equal(2, Assert.Single(dialogue.Loads).Slot);
        Assert.Contains("out of service (insert worn)", _model!.Snapshot().Notice, StringComparison.Ordinal);
        Assert.Equal("insert worn", _model.Snapshot().Slots[0].OutOfService);
        var record = File.ReadAllText(Path.Combine(_results, SlotServiceLog.FileName));
        Assert.Contains("\"slot\":1", record, StringComparison.Ordinal);
        Assert.Contains("\"operator\":\"badge-0412\"", record, StringComparison.Ordinal);
        Assert.Contains("2026-12-03T08:00:00", record, StringComparison.Ordinal);

        await dialogue.TakeAsync(OperatorEntry.Typed("slot 1 on"), default);
        Assert.Null(_model.Snapshot().Slots[0].OutOfService);
    }

    [Fact]
    public async Task TakeAsync_HistoryOfAnUnknownSerial_SaysNoRuns()
    {
        var dialogue = Dialogue();
        dialogue.Begin();

        await dialogue.TakeAsync(OperatorEntry.Typed("history CTP40A-2612-000001"), default);

        Assert.Equal(["History of CTP40A-2612-000001: no runs stored."], _model!.Snapshot().Info);
    }

    private OperatorDialogue Dialogue(bool plain = true, string mode = "engineering", string? operatorName = null, string? lot = null)
    {
        _model = new StationScreenModel(new ScreenHeader("ST-01", "DB4", "ctp40a-dac", 1, lot, operatorName, mode), [1, 2, 3, 4], [60], _time);
        return new OperatorDialogue(
            new StationTalk(_model, plain ? _plain : null), new ScanRules(Pattern, example: "CTP40A-2612-000123"), new SerialHistoryReader(_results),
            _time, [1, 2, 3, 4], mode, operatorName, lot, new SlotServiceLog(_results, "ST-01", NullLogger.Instance), NullLogger.Instance);
    }

    private static async Task StartAsync(OperatorDialogue dialogue, string serial)
    {
        dialogue.Begin();
        await dialogue.TakeAsync(OperatorEntry.Typed(serial), default);
        Assert.Equal(DialogueAction.StartBatch, await dialogue.TakeAsync(OperatorEntry.Typed(string.Empty), default));
        dialogue.BatchStarted();
    }

    private async Task RunBatchAsync(OperatorDialogue dialogue, string serial)
    {
        await StartAsync(dialogue, serial);
        _model!.UnitFinished(new LineTest.TestSupport.Builders.RunRecordBuilder().WithSerial(serial).Build());
        dialogue.BatchEnded("Batch done: 1 pass, 0 fail, 0 error.");
    }
}
