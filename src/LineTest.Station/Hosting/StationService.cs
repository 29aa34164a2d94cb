using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Scanning;
using LineTest.Core.Sequences;
using LineTest.Core.Throughput;
using LineTest.Rig.Serial.Scanner;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.Station.Screen;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Spectre.Console;

namespace LineTest.Station.Hosting;

/// <summary>
/// The station as a hosted service. The operator scans serials — a keyboard-wedge scanner types the serial and
/// Enter; a serial scanner named by the fixture sends it on its port — and each goes into the next free slot, or into
/// slot N when typed as <c>N SERIAL</c>. Both go through the same scan rules. An empty line starts the batch (it
/// starts by itself when every slot is full). While a batch runs, <c>cancel</c> cancels it and
/// <c>cancel N</c> cancels slot N, each after a confirmation. On a terminal the live screen is drawn; otherwise
/// plain lines are written. On shutdown the source goes to standby.
/// </summary>
public sealed partial class StationService : BackgroundService
{
    private readonly StationOptions _options;
    private readonly string _root;
    private readonly TextReader _input;
    private readonly TextWriter _output;
    private readonly TextWriter _error;
    private readonly ILoggerFactory _loggers;
    private readonly IHostApplicationLifetime _lifetime;
    private readonly ILogger<StationService> _logger;
    private readonly Lock _confirmGate = new();
    private TaskCompletionSource<string?>? _pendingConfirm;

    /// <summary>Creates the service.</summary>
    public StationService(StationServiceContext context, ILoggerFactory loggers, IHostApplicationLifetime lifetime)
    {
        ArgumentNullException.ThrowIfNull(context);
        _options = context.Options;
        _root = context.Root;
        _input = context.Input;
        _output = context.Output;
        _error = context.Error;
        _loggers = loggers;
        _lifetime = lifetime;
        _logger = loggers.CreateLogger<StationService>();
    }

    /// <summary>The exit code the process should end with.</summary>
    public int ExitCode { get; private set; } = ExitCodes.Done;

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        try
        {
            ExitCode = await RunStationAsync(stoppingToken).ConfigureAwait(false);
        }
        catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
        {
            ExitCode = ExitCodes.Done;
        }
        catch (RunStorageException ex)
        {
            _error.WriteLine($"STOPPED: results could not be stored ({ex.Message}). No new units are taken; call the test engineer.");
            ExitCode = ExitCodes.RuntimeFailure;
        }
        catch (ResultStoreException ex)
        {
            // The results folder or database cannot be used at all (read-only, locked, full, not ours): no unit may be
            // tested, since its run could not be kept.
            LogStoreUnusable(_logger, ex.Failure.ToString(), ex.Message);
            _error.WriteLine($"STOPPED: the results database cannot be used ({ex.Failure}): {ex.Message} No units are taken; call the test engineer.");
            ExitCode = ExitCodes.RuntimeFailure;
        }
        finally
        {
            _lifetime.StopApplication();
        }
    }

    private async Task<int> RunStationAsync(CancellationToken ct)
    {
        var fixtureResult = DefinitionFiles.LoadFixture(ContentRoot.Resolve(_root, _options.Fixture), _error);
        if (!fixtureResult.IsSuccess)
        {
            return ExitCodes.BadInput;
        }

        var fixture = fixtureResult.Value;
        var sequencePath = ContentRoot.Resolve(_root, _options.Sequence);
        var sequenceResult = DefinitionFiles.LoadSequence(sequencePath, fixture, _error);
        if (!sequenceResult.IsSuccess)
        {
            return ExitCodes.BadInput;
        }

        var sequence = sequenceResult.Value;
        var rules = new ScanRules(sequence.SerialPattern);
        var sensor = ReferenceConversion.SensorOf(fixture);
        var (opened, problem) = StationRig.Open(fixture, sequence, _options, ReferenceConversion.FromCelsius(sensor), _loggers);
        if (opened is null)
        {
            _error.WriteLine($"linetest: {problem}");
            return ExitCodes.BadInput;
        }

        using var rig = opened;
        var clock = rig.Clock;
        try
        {
            // Standby first: the source may hold a setpoint from a run that was interrupted; it also proves the
            // source answers before any unit is loaded.
            await rig.Instruments.Source.GoToStandbyAsync(ct).ConfigureAwait(false);
        }
        catch (Rig.Instruments.InstrumentFaultException ex)
        {
            _error.WriteLine($"linetest: the temperature source is not usable, so no unit can be tested: {ex.Message}. Run 'linetest probe' to check every instrument.");
            return ExitCodes.RuntimeFailure;
        }
        var resultsDir = ContentRoot.Resolve(_root, _options.Results);
        await using var store = SqliteResultStore.Open(resultsDir);
        var reader = SqliteResultReader.InDirectory(resultsDir);
        var model = new StationScreenModel(
            new ScreenHeader(_options.Id, fixture.Name ?? fixture.Id, sequence.Id, sequence.Revision, _options.Lot, _options.Operator, _options.Mode),
            fixture.Slots.Select(s => s.Slot),
            ExpectedStepSeconds(sequence, fixture),
            clock);
        var interactive = ReferenceEquals(_input, Console.In) && !Console.IsInputRedirected && !Console.IsOutputRedirected;
        using var input = interactive ? OperatorInput.FromConsoleKeys() : OperatorInput.FromLines(_input);
        var plain = interactive ? null : _output;
        using var serialScanner = fixture.Scanner is { Kind: "serial", Port: { } scannerPort }
            ? new SerialScanner(scannerPort, _loggers.CreateLogger<SerialScanner>(), TimeProvider.System)
            : null;
        await using var scannerFeed = serialScanner is null
            ? null
            : ScannerFeed.Start(serialScanner, serialScanner.Port.Name, input, TimeProvider.System, _loggers.CreateLogger<ScannerFeed>());
        var sink = new StoreSink(store, run => plain?.WriteLine(DemoCommand.UnitLine(run)));
        var coordinator = new BatchCoordinator(rig.Instruments, fixture, ReferenceConversion.ToCelsius(sensor), clock, sink,
            new ScreenOperator(model, WaitForConfirmAsync, plain), model, _loggers.CreateLogger<BatchCoordinator>(), partFitting: rig.PartFitting);

        var recovered = await StartupRecovery.RunAsync(coordinator, store, _logger, ct).ConfigureAwait(false);
        if (recovered.Count > 0)
        {
            _error.WriteLine(StartupRecovery.Message(recovered.Count));
            model.Prompt(StartupRecovery.Message(recovered.Count));
        }

        var refusal = await ProductionGate.RefusalAsync(_options.Mode, store, sequence.Id, sequence.Revision, sequenceResult.Sha256!, sequencePath, ct)
            .ConfigureAwait(false);
        if (refusal is not null)
        {
            _error.WriteLine($"linetest: production mode refuses the sequence: {refusal}");
            return ExitCodes.BadInput;
        }

        WriteSafetyNote(interactive);
        using var screenStop = new CancellationTokenSource();
        var screen = interactive ? DrawScreenAsync(model, input, screenStop.Token) : Task.CompletedTask;
        try
        {
            OperatorEntry? carried = null;
            while (!ct.IsCancellationRequested)
            {
                var loads = await ScanBatchAsync(fixture, rules, reader, rig, model, input, plain, clock, carried, ct).ConfigureAwait(false);
                carried = null;
                if (loads is null)
                {
                    return ExitCodes.Done;
                }

                model.Notice(null);
                Say(model, plain, $"Batch of {loads.Count} started. Keep clear of the block while it runs. Type 'cancel' or 'cancel N' to stop.");
                using var batchCancel = CancellationTokenSource.CreateLinkedTokenSource(ct);
                var batch = coordinator.RunAsync(
                    new BatchRequest
                    {
                        Sequence = sequence,
                        SequenceSha256 = sequenceResult.Sha256,
                        Station = _options.Id,
                        Loads = loads,
                        Operator = _options.Operator,
                        Lot = _options.Lot,
                        Mode = _options.Mode,
                    },
                    batchCancel.Token);
                var commands = HandleCommandsAsync(input, coordinator, model, plain, batchCancel, batch);
                BatchOutcome outcome;
                try
                {
                    outcome = await batch.ConfigureAwait(false);
                }
                catch (RunStorageException ex)
                {
                    model.Alarm($"RESULTS CANNOT BE STORED: {ex.Message}. No new units are taken; call the test engineer.");
                    throw;
                }

                await commands.ConfigureAwait(false);
                var pass = outcome.Runs.Count(r => r.Verdict == Verdict.Pass);
                var fail = outcome.Runs.Count(r => r.Verdict == Verdict.Fail);
                var error = outcome.Runs.Count(r => r.Verdict == Verdict.Error);
                Say(model, plain, $"Batch done: {pass} pass, {fail} fail, {error} error. Unload and sort the units (inserts may be hot or cold), then scan the next.");
                foreach (var load in loads)
                {
                    rig.Unloaded(load.Slot);
                }

                if (interactive)
                {
                    // The verdicts stay on screen until the operator presses Enter or scans the next unit (that scan
                    // is the first of the next batch).
                    var next = await NextEntryAsync(input, model, plain, ct).ConfigureAwait(false);
                    carried = next is { Kind: OperatorEntryKind.Scanned } ? next : null;
                }

                model.UnloadAll();
            }
        }
        finally
        {
            await coordinator.StandbyAsync("station stopping").ConfigureAwait(false);
            await screenStop.CancelAsync().ConfigureAwait(false);
            await screen.ConfigureAwait(false);
        }

        return ExitCodes.Done;
    }

    private async Task<List<SlotLoad>?> ScanBatchAsync(
        FixtureDefinition fixture, ScanRules rules, SqliteResultReader reader, StationRig rig,
        StationScreenModel model, OperatorInput input, TextWriter? plain, TimeProvider clock, OperatorEntry? carried, CancellationToken ct)
    {
        var loads = new List<SlotLoad>();
        var slots = fixture.Slots.Select(s => s.Slot).Order().ToList();
        while (loads.Count < slots.Count)
        {
            var free = slots.Where(s => loads.All(l => l.Slot != s)).ToList();
            Say(model, plain, loads.Count == 0
                ? $"Scan the serial for slot {free[0]} (or type 'N SERIAL' for slot N)."
                : $"Scan the serial for slot {free[0]}, or press Enter to start the batch of {loads.Count}.");
            var entry = carried ?? await NextEntryAsync(input, model, plain, ct).ConfigureAwait(false);
            carried = null;
            if (entry is null)
            {
                return loads.Count > 0 ? loads : null;
            }

            string text;
            var slot = free[0];
            if (entry.Kind == OperatorEntryKind.Scanned)
            {
                // A serial scanner's code: already checked as a serial (or refused with why); it goes to the next free slot.
                if (entry.Scan!.Serial is not { } scanned)
                {
                    Tell(model, plain, $"Refused: {entry.Scan.Problem}.");
                    continue;
                }

                text = scanned;
            }
            else
            {
                text = entry.Text!.Trim();
                if (text.Length == 0)
                {
                    if (loads.Count > 0)
                    {
                        return loads;
                    }

                    continue;
                }

                if (text.Equals("quit", StringComparison.OrdinalIgnoreCase) && loads.Count == 0)
                {
                    return null;
                }

                var parts = text.Split(' ', 2, StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
                if (parts.Length == 2 && int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out var named))
                {
                    if (!free.Contains(named))
                    {
                        Tell(model, plain, $"Refused: slot {named} is {(slots.Contains(named) ? "already loaded" : "not a slot of this fixture")}.");
                        continue;
                    }

                    slot = named;
                    text = parts[1];
                }
            }

            var history = await HistoryAsync(reader, text, clock, ct).ConfigureAwait(false);
            var decision = rules.Check(text, loads.Select(l => l.Serial).ToList(), history);
            if (!decision.Accepted)
            {
                Tell(model, plain, $"Refused: {decision.Reason}.");
                continue;
            }

            rig.Loaded(slot, decision.Serial);
            loads.Add(new SlotLoad(slot, decision.Serial));
            model.Loaded(slot, decision.Serial, decision.IsRetest);
            plain?.WriteLine($"Loaded {decision.Serial} in slot {slot}{(decision.IsRetest ? " (retest)" : string.Empty)}.");
            LogScanned(_logger, decision.Serial, slot, decision.IsRetest, entry.Kind == OperatorEntryKind.Scanned ? "serial scanner" : "keyboard");
        }

        return loads;
    }

    // The next typed line or scan; scanner notices are shown on the way.
    private static async Task<OperatorEntry?> NextEntryAsync(OperatorInput input, StationScreenModel model, TextWriter? plain, CancellationToken ct)
    {
        while (await input.ReadAsync(ct).ConfigureAwait(false) is { } entry)
        {
            if (entry.Kind != OperatorEntryKind.ScannerNotice)
            {
                return entry;
            }

            Tell(model, plain, entry.Text!);
        }

        return null;
    }

    private static async Task<SerialHistory> HistoryAsync(SqliteResultReader reader, string serial, TimeProvider clock, CancellationToken ct)
    {
        if (!File.Exists(reader.DatabasePath))
        {
            return SerialHistory.None;
        }

        var today = new DateTimeOffset(clock.GetUtcNow().UtcDateTime.Date, TimeSpan.Zero);
        int runs = 0;
        var passedToday = false;
        await foreach (var run in reader.ReadRunsAsync(new RunFilter { Serial = serial.Trim() }, ct).ConfigureAwait(false))
        {
            runs++;
            passedToday |= run.Verdict == Verdict.Pass && run.EndedUtc >= today;
        }

        return new SerialHistory(runs, passedToday);
    }

    private async Task HandleCommandsAsync(
        OperatorInput input, BatchCoordinator coordinator, StationScreenModel model, TextWriter? plain, CancellationTokenSource batchCancel, Task batch)
    {
        using var stop = new CancellationTokenSource();
        _ = batch.ContinueWith(_ => stop.Cancel(), TaskScheduler.Default);
        string? pendingCancel = null;
        try
        {
            while (!batch.IsCompleted)
            {
                var entry = await NextEntryAsync(input, model, plain, stop.Token).ConfigureAwait(false);
                if (entry is null)
                {
                    await batch.ConfigureAwait(false);
                    return;
                }

                if (entry.Kind == OperatorEntryKind.Scanned)
                {
                    // A scan never answers a prompt or a cancel question: it is refused until the batch is done.
                    Tell(model, plain, entry.Scan!.Serial is { } serial
                        ? $"Refused: {serial} was scanned while a batch runs; scan it again when the batch is done."
                        : $"Refused: {entry.Scan.Problem}.");
                    continue;
                }

                var line = entry.Text!;
                if (TryCompleteConfirm(line))
                {
                    continue;
                }

                var text = line.Trim();
                if (pendingCancel is not null)
                {
                    if (text.Equals("yes", StringComparison.OrdinalIgnoreCase))
                    {
                        if (pendingCancel == "batch")
                        {
                            await batchCancel.CancelAsync().ConfigureAwait(false);
                        }
                        else
                        {
                            coordinator.RequestSlotCancel(int.Parse(pendingCancel, CultureInfo.InvariantCulture), "cancelled by the operator");
                        }

                        Say(model, plain, "Cancelling. The block goes to standby if the whole batch stops.");
                    }
                    else
                    {
                        Say(model, plain, "Not cancelled; the batch carries on.");
                    }

                    pendingCancel = null;
                    continue;
                }

                if (text.Equals("cancel", StringComparison.OrdinalIgnoreCase))
                {
                    pendingCancel = "batch";
                    Say(model, plain, "Cancel the whole batch? Type 'yes' to confirm, anything else to carry on.");
                }
                else if (text.StartsWith("cancel ", StringComparison.OrdinalIgnoreCase)
                    && int.TryParse(text[7..].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var slot))
                {
                    pendingCancel = slot.ToString(CultureInfo.InvariantCulture);
                    Say(model, plain, $"Cancel slot {slot}? Type 'yes' to confirm, anything else to carry on.");
                }
            }
        }
        catch (OperationCanceledException)
        {
            // The batch ended while waiting for a line.
        }
    }

    private async Task<string?> WaitForConfirmAsync(CancellationToken ct)
    {
        var tcs = new TaskCompletionSource<string?>(TaskCreationOptions.RunContinuationsAsynchronously);
        lock (_confirmGate)
        {
            _pendingConfirm = tcs;
        }

        using var registration = ct.Register(() => tcs.TrySetCanceled(ct));
        return await tcs.Task.ConfigureAwait(false);
    }

    private bool TryCompleteConfirm(string line)
    {
        lock (_confirmGate)
        {
            if (_pendingConfirm is { } pending)
            {
                _pendingConfirm = null;
                return pending.TrySetResult(line);
            }
        }

        return false;
    }

    private static async Task DrawScreenAsync(StationScreenModel model, OperatorInput input, CancellationToken ct)
    {
        await AnsiConsole.Live(ScreenRenderer.Build(model.Snapshot()))
            .AutoClear(false)
            .Overflow(VerticalOverflow.Ellipsis)
            .StartAsync(async ctx =>
            {
                while (!ct.IsCancellationRequested)
                {
                    ctx.UpdateTarget(ScreenRenderer.Build(model.Snapshot(), input.Buffer));
                    try
                    {
                        await Task.Delay(200, ct).ConfigureAwait(false);
                    }
                    catch (OperationCanceledException)
                    {
                        break;
                    }
                }

                ctx.UpdateTarget(ScreenRenderer.Build(model.Snapshot()));
            }).ConfigureAwait(false);
    }

    private static IReadOnlyList<double> ExpectedStepSeconds(SequenceDefinition sequence, FixtureDefinition fixture)
    {
        // Settle steps dominate a batch: expect each to take its thermal-bound leg; other steps a few seconds.
        var timing = new InstrumentTiming();
        var bound = ThermalBound.Compute(sequence, fixture.Source, fixture.Source.StandbyC, fixture.Slots.Count, timing.ReferenceReadSeconds, timing.MeterReadSeconds);
        var legs = new Queue<ThermalBoundLeg>(bound.Legs);
        return sequence.Steps.Select(step => step switch
        {
            SettleStep when legs.Count > 0 => legs.Peek().TravelSeconds + legs.Peek().StableWindowSeconds + legs.Dequeue().SoakSeconds,
            MeasureStep m => m.Samples * (timing.ReferenceReadSeconds + fixture.Slots.Count * timing.MeterReadSeconds),
            VerifyStep v => v.Samples * (timing.ReferenceReadSeconds + fixture.Slots.Count * timing.MeterReadSeconds),
            _ => 5.0,
        }).ToList();
    }

    private void WriteSafetyNote(bool interactive)
    {
        if (interactive)
        {
            AnsiConsole.Write(new Panel(new Markup(string.Join("\n", SafetyNote.Lines.Select(Markup.Escape)))).Header("[bold red] Safety [/]").BorderColor(Color.Red));
        }
        else
        {
            foreach (var line in SafetyNote.Lines)
            {
                _output.WriteLine(line);
            }
        }
    }

    private static void Say(StationScreenModel model, TextWriter? plain, string text)
    {
        model.Prompt(text);
        plain?.WriteLine(text);
    }

    // A refusal or scanner message: above the prompt on the screen, so the instruction stays in view.
    private static void Tell(StationScreenModel model, TextWriter? plain, string text)
    {
        model.Notice(text);
        plain?.WriteLine(text);
    }

    [LoggerMessage(EventId = 2012, Level = LogLevel.Critical, Message = "The results database cannot be used ({Failure}): {Reason}. The station takes no units.")]
    private static partial void LogStoreUnusable(ILogger logger, string failure, string reason);

    [LoggerMessage(EventId = 2001, Level = LogLevel.Information, Message = "Scanned {Serial} into slot {Slot} (retest: {IsRetest}, from the {ScanSource})")]
    private static partial void LogScanned(ILogger logger, string serial, int slot, bool isRetest, string scanSource);
}
