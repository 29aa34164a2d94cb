using System.Text.RegularExpressions;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.Station.Demo;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Hosting;

/// <summary>
/// The station as a hosted service: serials are scanned (a keyboard-wedge scanner types the serial and Enter),
/// each into the next free slot; an empty line starts the batch (it starts by itself when every slot is full).
/// Runs are stored as they end. On shutdown the source goes to standby.
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
        var sequenceResult = DefinitionFiles.LoadSequence(ContentRoot.Resolve(_root, _options.Sequence), fixture, _error);
        if (!sequenceResult.IsSuccess)
        {
            return ExitCodes.BadInput;
        }

        if (fixture.Rig != "simulator")
        {
            _error.WriteLine($"linetest: fixture '{fixture.Id}' names real instruments; serial drivers are not available in this build. Use a simulator fixture.");
            return ExitCodes.RuntimeFailure;
        }

        var sequence = sequenceResult.Value;
        var serialPattern = new Regex(sequence.SerialPattern, RegexOptions.None, TimeSpan.FromSeconds(1));
        var sensor = ReferenceConversion.SensorOf(fixture);
        var clock = new ScaledTimeProvider(_options.SimulatorSpeed);
        var rig = new SimulatedRig(fixture, _options.SimulatorSeed, clock, ReferenceConversion.FromCelsius(sensor));
        var design = SimulatedUnitDesign.ForProduct(sequence.Product);
        if (design is null)
        {
            _error.WriteLine($"linetest: sequence '{sequence.Id}' tests '{sequence.Product}', but the simulator builds only {string.Join(", ", SimulatedUnitDesign.Demo.Select(d => d.Product))}.");
            return ExitCodes.BadInput;
        }

        var factory = new SimulatedUnitFactory(_options.SimulatorSeed, rig.Simulation, design);
        await using var store = SqliteResultStore.Open(ContentRoot.Resolve(_root, _options.Results));
        var sink = new StoreSink(store, run => _output.WriteLine(DemoCommand.UnitLine(run)));
        var coordinator = new BatchCoordinator(rig.Instruments, fixture, ReferenceConversion.ToCelsius(sensor), clock, sink,
            new ConsoleOperator(_input, _output), null, _loggers.CreateLogger<BatchCoordinator>(), partFitting: new SimulatedPartFitting(rig));
        WriteBanner(fixture, sequence);
        try
        {
            while (!ct.IsCancellationRequested)
            {
                var loads = await ScanBatchAsync(fixture, serialPattern, factory, rig, ct).ConfigureAwait(false);
                if (loads is null)
                {
                    return ExitCodes.Done;
                }

                _output.WriteLine($"Batch of {loads.Count} started. Keep clear of the block while it runs.");
                var outcome = await coordinator.RunAsync(
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
                    ct).ConfigureAwait(false);
                foreach (var load in loads)
                {
                    rig.Unload(load.Slot);
                }

                _output.WriteLine($"Batch done: {outcome.Runs.Count(r => r.Verdict == Verdict.Pass)} pass, {outcome.Runs.Count(r => r.Verdict == Verdict.Fail)} fail, {outcome.Runs.Count(r => r.Verdict == Verdict.Error)} error. Unload the units (caution: inserts may be hot or cold).");
            }
        }
        finally
        {
            await coordinator.StandbyAsync("station stopping").ConfigureAwait(false);
        }

        return ExitCodes.Done;
    }

    private async Task<List<SlotLoad>?> ScanBatchAsync(
        FixtureDefinition fixture, Regex pattern, SimulatedUnitFactory factory, SimulatedRig rig, CancellationToken ct)
    {
        var loads = new List<SlotLoad>();
        var slots = fixture.Slots.Select(s => s.Slot).Order().ToList();
        while (loads.Count < slots.Count)
        {
            var slot = slots[loads.Count];
            _output.WriteLine($"Scan the serial for slot {slot} (Enter on an empty line starts the batch):");
            var line = await _input.ReadLineAsync(ct).ConfigureAwait(false);
            if (line is null)
            {
                return loads.Count > 0 ? loads : null;
            }

            var serial = line.Trim();
            if (serial.Length == 0)
            {
                if (loads.Count > 0)
                {
                    return loads;
                }

                continue;
            }

            if (!pattern.IsMatch(serial))
            {
                _output.WriteLine($"Refused: '{serial}' is not a serial of this product (expected pattern {pattern}).");
                continue;
            }

            if (loads.Any(l => l.Serial == serial))
            {
                _output.WriteLine($"Refused: {serial} is already in slot {loads.First(l => l.Serial == serial).Slot}.");
                continue;
            }

            rig.Load(slot, factory.NextUnit(serial));
            loads.Add(new SlotLoad(slot, serial));
            LogScanned(_logger, serial, slot);
        }

        return loads;
    }

    private void WriteBanner(FixtureDefinition fixture, SequenceDefinition sequence)
    {
        _output.WriteLine($"LineTest station {_options.Id} — fixture {fixture.Name ?? fixture.Id}, sequence {sequence.Id} r{sequence.Revision} ({sequence.Product}), {_options.Mode} mode");
        foreach (var line in SafetyNote.Lines)
        {
            _output.WriteLine(line);
        }
    }

    [LoggerMessage(EventId = 2001, Level = LogLevel.Information, Message = "Scanned {Serial} into slot {Slot}")]
    private static partial void LogScanned(ILogger logger, string serial, int slot);
}
