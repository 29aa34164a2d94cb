using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Scanning;
using LineTest.Core.Sequences;
using LineTest.Core.Sequences.Steps;
using LineTest.Core.Throughput;
using LineTest.Factory.Forwarding;
using LineTest.Rig.Serial.Scanner;
using LineTest.Runtime.Batches;
using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.Station.Screen;
using LineTest.Storage.History;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Spectre.Console;

namespace LineTest.Station.Hosting;

/// <summary>
/// The station as a hosted service: composes the fixture, instruments, store and coordinator, then runs the shift
/// (<see cref="StationShift"/>, with the operator dialogue and the live screen). Its failure policy: a run that cannot
/// be stored, or any other exception, stores the runs in progress as <c>error</c> with the reason, sends the source to
/// standby, says so on the screen and ends with exit 1; Ctrl-C (confirmed during a batch) ends with 130 and SIGTERM
/// with 143, the runs of a batch in progress stored as <c>error</c> (cancelled). Never 0 after a stop or a failure.
/// </summary>
public sealed partial class StationService : BackgroundService
{
    private readonly StationServiceContext _context;
    private readonly StationOptions _options;
    private readonly TextWriter _error;
    private readonly ILoggerFactory _loggers;
    private readonly IHostApplicationLifetime _lifetime;
    private readonly ILogger<StationService> _logger;
    private readonly IFactoryBacklog? _factory;

    /// <summary>Creates the service; <paramref name="factory"/> is the forwarding backlog when runs go to a factory database.</summary>
    public StationService(StationServiceContext context, ILoggerFactory loggers, IHostApplicationLifetime lifetime, IFactoryBacklog? factory = null)
    {
        _factory = factory;
        ArgumentNullException.ThrowIfNull(context);
        _context = context;
        _options = context.Options;
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
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            LogStationFailed(_logger, ex);
            _error.WriteLine($"STOPPED: the station failed: {ex.Message}. Call the test engineer.");
            ExitCode = ExitCodes.RuntimeFailure;
        }
        finally
        {
            _context.Logging.ConsoleOpen = true;
            _context.Logging.ScreenMessage = null;
            _context.Logging.Clock = null;
            _lifetime.StopApplication();
        }
    }

    private async Task<int> RunStationAsync(CancellationToken ct)
    {
        var root = _context.Root;
        var fixtureResult = DefinitionFiles.LoadFixture(ContentRoot.Resolve(root, _options.Fixture), _error);
        if (!fixtureResult.IsSuccess)
        {
            return ExitCodes.BadInput;
        }

        var fixture = fixtureResult.Value;
        var sequencePath = ContentRoot.Resolve(root, _options.Sequence);
        var sequenceResult = DefinitionFiles.LoadSequence(sequencePath, fixture, _error);
        if (!sequenceResult.IsSuccess)
        {
            return ExitCodes.BadInput;
        }

        var sequence = sequenceResult.Value;
        var sensor = ReferenceConversion.SensorOf(fixture);
        var (opened, problem) = StationRig.Open(fixture, sequence, _options, ReferenceConversion.FromCelsius(sensor), _loggers);
        if (opened is null)
        {
            _error.WriteLine($"linetest: {problem}");
            return ExitCodes.BadInput;
        }

        using var rig = opened;
        if (rig.IsSimulated)
        {
            // Log events carry the simulated time, so they line up with the stored runs.
            _context.Logging.Clock = rig.Clock;
        }

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

        var resultsDir = ContentRoot.Resolve(root, _options.Results);
        await using var store = SqliteResultStore.Open(resultsDir);
        var model = new StationScreenModel(
            new ScreenHeader(_options.Id, fixture.Name ?? fixture.Id, sequence.Id, sequence.Revision, _options.Lot, _options.Operator, _options.Mode),
            fixture.Slots.Select(s => s.Slot),
            ExpectedStepSeconds(sequence, fixture),
            rig.Clock) { Words = new StepWords(sequence), Factory = _factory };
        var interactive = ReferenceEquals(_context.Input, Console.In) && !Console.IsInputRedirected && !Console.IsOutputRedirected;
        if (interactive)
        {
            // The live screen owns the terminal from the start: events of start-up and recovery (source to standby,
            // interrupted runs) go to the log file, warnings to the screen, so no log line sits above the screen.
            _context.Logging.ConsoleOpen = false;
            _context.Logging.ScreenMessage = text => model.Notice(text);
        }

        using var input = interactive ? OperatorInput.FromConsoleKeys() : OperatorInput.FromLines(_context.Input);
        var talk = new StationTalk(model, interactive ? null : _context.Output);
        using var serialScanner = fixture.Scanner is { Kind: "serial", Port: { } scannerPort }
            ? new SerialScanner(scannerPort, _loggers.CreateLogger<SerialScanner>(), TimeProvider.System)
            : null;
        await using var scannerFeed = serialScanner is null
            ? null
            : ScannerFeed.Start(serialScanner, serialScanner.Port.Name, input, TimeProvider.System, _loggers.CreateLogger<ScannerFeed>());
        var prompts = new PromptAnswers();
        var sink = new StoreSink(store, run => talk.Log(DemoCommand.UnitLine(run)));
        var coordinator = StationComposition.Coordinator(fixture, rig.Instruments, rig.Clock, sink, new CoordinatorParts
        {
            Operator = new ScreenOperator(model, prompts.WaitAsync, interactive ? null : _context.Output),
            Observer = _context.Observe?.Invoke(model) ?? model,
            Logger = _loggers.CreateLogger<BatchCoordinator>(),
            PartFitting = rig.PartFitting,
        });

        var recovered = await StartupRecovery.RunAsync(coordinator, store, _logger, ct).ConfigureAwait(false);
        if (recovered.Count > 0)
        {
            _error.WriteLine(StartupRecovery.Message(recovered.Count));
            model.Notice(StartupRecovery.Message(recovered.Count));
        }

        var refusal = await ProductionGate.RefusalAsync(_options.Mode, store, sequence.Id, sequence.Revision, sequenceResult.Sha256!, sequencePath, ct)
            .ConfigureAwait(false);
        if (refusal is not null)
        {
            _error.WriteLine($"linetest: production mode refuses the sequence: {refusal}");
            return ExitCodes.BadInput;
        }

        var dialogue = new OperatorDialogue(
            talk, new ScanRules(sequence.SerialPattern, example: sequence.SerialExample), new SerialHistoryReader(resultsDir), rig.Clock,
            fixture.Slots.Select(s => s.Slot), _options.Mode, _options.Operator, _options.Lot,
            new SlotServiceLog(resultsDir, _options.Id, _loggers.CreateLogger<SlotServiceLog>()), _logger);
        var template = new BatchRequest { Sequence = sequence, SequenceSha256 = sequenceResult.Sha256!, Station = _options.Id, Loads = [], Mode = _options.Mode };
        var shift = new StationShift(dialogue, talk, input, coordinator, rig, prompts, _context.Signals, template, _logger) { AskBeforeStop = interactive };
        _context.Signals?.Claim();
        WriteSafetyNote(interactive);
        using var screenStop = new CancellationTokenSource();
        if (interactive)
        {
            // The live screen owns the terminal: log events go to the file only; warnings reach the operator on screen.
            _context.Logging.ConsoleOpen = false;
            _context.Logging.ScreenMessage = text => model.Notice(text);
        }

        var screen = interactive ? LiveScreen.RunAsync(model, () => input.Buffer, screenStop.Token) : Task.CompletedTask;
        string? failure = null;
        try
        {
            var end = await shift.RunAsync(ct).ConfigureAwait(false);
            return end switch
            {
                ShiftEnd.Interrupted => ExitCodes.Interrupted,
                ShiftEnd.Terminated => ExitCodes.Terminated,
                _ => ExitCodes.Done,
            };
        }
        catch (Exception ex) when (ex is not (RunStorageException or ResultStoreException or OperationCanceledException or OutOfMemoryException))
        {
            failure = ex.Message;
            LogStationFailed(_logger, ex);
            var stored = await StoreInProgressAsErrorAsync(store, $"station fault: {ex.Message}").ConfigureAwait(false);
            model.Alarm($"STOPPED: the station failed ({ex.Message}). {stored} run(s) in progress stored as error; the block goes to standby. Call the test engineer.");
            return ExitCodes.RuntimeFailure;
        }
        finally
        {
            await coordinator.StandbyAsync(failure is null ? "station stopping" : "station failed").ConfigureAwait(false);
            await screenStop.CancelAsync().ConfigureAwait(false);
            await screen.ConfigureAwait(false);
            _context.Logging.ConsoleOpen = true;
            _context.Logging.ScreenMessage = null;
            if (failure is not null)
            {
                _error.WriteLine($"STOPPED: the station failed: {failure}. Runs in progress were stored as error; the block was sent to standby. Call the test engineer.");
            }
        }
    }

    // The coordinator did not end its runs (it failed): store what the journal holds as error with the reason.
    private async Task<int> StoreInProgressAsErrorAsync(SqliteResultStore store, string reason)
    {
        try
        {
            var inProgress = await store.ReadJournalAsync(CancellationToken.None).ConfigureAwait(false);
            foreach (var run in inProgress)
            {
                await store.AppendAsync(run with { Verdict = Verdict.Error, Reason = reason }, CancellationToken.None).ConfigureAwait(false);
            }

            return inProgress.Count;
        }
        catch (ResultStoreException ex)
        {
            // The next start stores them as interrupted.
            LogStoreUnusable(_logger, ex.Failure.ToString(), ex.Message);
            return 0;
        }
    }

    private static IReadOnlyList<double> ExpectedStepSeconds(SequenceDefinition sequence, FixtureDefinition fixture)
    {
        // Settle steps dominate a batch: expect each to take its thermal-bound leg; other steps a few seconds.
        var timing = new InstrumentTiming();
        var bound = ThermalBound.Compute(sequence, fixture.Source, fixture.Source.StandbyC, fixture.Slots.Count, timing.ReferenceReadSeconds, timing.MeterReadSeconds);
        var legs = new Queue<ThermalBoundLeg>(bound.Legs);
        var model = new StepTimeModel(fixture.Slots.Count, timing.ReferenceReadSeconds, timing.MeterReadSeconds);

        // Each step kind estimates its own time (sweeps included); settle steps take their thermal-bound leg.
        return sequence.Steps.Select(step => step is SettleStep && legs.Count > 0
            ? legs.Peek().TravelSeconds + legs.Peek().StableWindowSeconds + legs.Dequeue().SoakSeconds
            : StepKinds.Of(step).EstimateSeconds(step, model)).ToList();
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
                _context.Output.WriteLine(line);
            }
        }
    }

    [LoggerMessage(EventId = 2012, Level = LogLevel.Critical, Message = "The results database cannot be used ({Failure}): {Reason}. The station takes no units.")]
    private static partial void LogStoreUnusable(ILogger logger, string failure, string reason);

    [LoggerMessage(EventId = 2013, Level = LogLevel.Critical, Message = "The station failed; runs in progress are stored as error and the source goes to standby")]
    private static partial void LogStationFailed(ILogger logger, Exception exception);
}
