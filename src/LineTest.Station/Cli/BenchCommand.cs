using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using LineTest.Station.Composition;
using LineTest.Station.Demo;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest bench</c>: simulated units per hour of the baseline schedule, of LineTest and of the thermal bound for
/// each demo sequence, and the wall time and memory of a simulated shift.
/// </summary>
public static class BenchCommand
{
    /// <summary>The demo sequences benchmarked when none is given.</summary>
    public static IReadOnlyList<string> DemoSequences { get; } =
        ["sequences/ctp40a-dac.json", "sequences/ctp40r-resistor.json", "sequences/ctp40d-firmware.json"];

    /// <summary>
    /// The sequences <c>--accuracy</c> measures when none is given: the demo sequences and the three-point variants of the
    /// gain-and-offset ones (their third calibration point measures each unit's curvature).
    /// </summary>
    public static IReadOnlyList<string> AccuracySequences { get; } =
        [.. DemoSequences, "sequences/ctp40a-dac-3pt.json", "sequences/ctp40r-resistor-3pt.json"];

    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var sequences = new Option<string[]>("--sequence") { Description = "Sequence file (repeatable; default: the three demo sequences, with --accuracy also their three-point variants)", AllowMultipleArgumentsPerToken = false };
        var fixture = new Option<string?>("--fixture") { Description = "Simulated fixture (default: the station's)" };
        var batches = new Option<int>("--batches") { Description = "Full batches per sequence for the throughput figures", DefaultValueFactory = _ => 5 };
        var shiftUnits = new Option<int>("--shift-units") { Description = "Units in the shift whose wall time and memory are measured (0: skip)", DefaultValueFactory = _ => 1000 };
        var json = new Option<bool>("--json") { Description = "Print the figures as one JSON object (with --accuracy: a JSON array)" };
        var accuracy = new Option<bool>("--accuracy")
        {
            Description = "Instead of throughput: the true post-trim error over each sequence's rated range (simulator ground truth) per fit, against the error budget's floor",
        };
        var accuracyBatches = new Option<int>("--accuracy-batches") { Description = "Full batches per sequence and fit for --accuracy", DefaultValueFactory = _ => 25 };
        var page = new Option<bool>("--page")
        {
            Description = "Instead of throughput: the shift of --shift-units with the live page closed and served in this process and polled, in --pairs alternating pairs",
        };
        var lineSeconds = new Option<double>("--page-line-seconds") { Description = "With --page: seconds between fetches of the line page", DefaultValueFactory = _ => 1 };
        var yieldSeconds = new Option<double>("--page-yield-seconds") { Description = "With --page: seconds between fetches of the yield page and a serial search", DefaultValueFactory = _ => 5 };
        var pairs = new Option<int>("--pairs") { Description = "Pairs of shifts (page closed, page open) for --page, after one warm-up pair", DefaultValueFactory = _ => 5 };
        var settle = new Option<string?>("--settle")
        {
            Description = "Settle every setpoint of every sequence in this mode (window or predictive) instead of as the sequence says",
        };
        var maxExtrapolation = new Option<double>("--max-extrapolation-uncertainty")
        {
            Description = "With --settle predictive: the largest u of the extrapolated final value, degC",
            DefaultValueFactory = _ => DefaultMaxExtrapolationUncertaintyC,
        };
        var command = new Command("bench", "Simulated throughput against the baseline and the thermal bound, and the engine's own cost")
        {
            sequences, fixture, batches, shiftUnits, json, accuracy, accuracyBatches, page, pairs, lineSeconds, yieldSeconds, settle, maxExtrapolation,
        };
        command.SetAction(async (parse, ct) =>
        {
            var fixturePath = parse.GetValue(fixture) is { } f ? Path.GetFullPath(f) : ContentRoot.Resolve(context.Root, context.Options.Fixture);
            var fixtureResult = DefinitionFiles.LoadFixture(fixturePath, context.Error);
            if (!fixtureResult.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            var fx = fixtureResult.Value;
            if (fx.Rig != "simulator")
            {
                return context.BadInput($"fixture '{fx.Id}' drives real instruments; bench needs a simulator fixture");
            }

            var batchCount = parse.GetValue(batches);
            var shiftCount = parse.GetValue(shiftUnits);
            if (batchCount < 1)
            {
                return context.BadInput($"--batches must be 1 or more, not {batchCount}");
            }

            if (shiftCount < 0)
            {
                return context.BadInput($"--shift-units must be 0 or more, not {shiftCount}");
            }

            var settleMode = parse.GetValue(settle);
            if (settleMode is not null && !Core.Sequences.SettleModes.All.Contains(settleMode, StringComparer.Ordinal))
            {
                return context.BadInput($"--settle must be {string.Join(" or ", Core.Sequences.SettleModes.All)}, not '{settleMode}'");
            }

            var files = parse.GetValue(sequences) is { Length: > 0 } given
                ? given.Select(Path.GetFullPath).ToList()
                : (parse.GetValue(accuracy) ? AccuracySequences : DemoSequences).Select(s => ContentRoot.Resolve(context.Root, s)).ToList();
            var loaded = new List<(Core.Sequences.SequenceDefinition Sequence, string Sha256)>();
            foreach (var file in files)
            {
                var result = DefinitionFiles.LoadSequence(file, fx, context.Error);
                if (!result.IsSuccess)
                {
                    return ExitCodes.BadInput;
                }

                if (Rig.Simulation.SimulatedUnitDesign.ForProduct(result.Value.Product) is null)
                {
                    return context.BadInput($"the simulator builds no '{result.Value.Product}' units (sequence {file})");
                }

                var forced = ForceSettle(result.Value, settleMode, parse.GetValue(maxExtrapolation));
                if (forced.Problem is { } problem)
                {
                    return context.BadInput(problem);
                }

                loaded.Add((forced.Sequence!, result.Sha256));
            }

            if (parse.GetValue(accuracy))
            {
                return await AccuracyCommand.RunAsync(context, fx, loaded.Select(l => l.Sequence).ToList(), parse.GetValue(accuracyBatches), parse.GetValue(json), ct)
                    .ConfigureAwait(false);
            }

            if (parse.GetValue(page))
            {
                return await PageBenchOutput.RunAsync(context, fx, loaded[0].Sequence, loaded[0].Sha256, shiftCount, parse.GetValue(pairs), (parse.GetValue(lineSeconds), parse.GetValue(yieldSeconds)), parse.GetValue(json), ct)
                    .ConfigureAwait(false);
            }

            // The shift first, so that the process's peak working set is the shift's and not the throughput runs'.
            EngineFigures? engine = null;
            if (shiftCount > 0)
            {
                var results = Path.Combine(Path.GetTempPath(), $"linetest-bench-{Guid.NewGuid():N}");
                try
                {
                    engine = await ThroughputBench.ShiftAsync(fx, loaded[0].Sequence, loaded[0].Sha256, shiftCount, context.Options.SimulatorSeed, results,
                        context.Loggers, ct).ConfigureAwait(false);
                }
                finally
                {
                    if (Directory.Exists(results))
                    {
                        Directory.Delete(results, recursive: true);
                    }
                }
            }

            EngineFigures? engineOnly = null;
            if (shiftCount > 0)
            {
                engineOnly = await ThroughputBench.EngineOnlyAsync(fx, loaded[0].Sequence, loaded[0].Sha256, shiftCount, context.Options.SimulatorSeed, ct)
                    .ConfigureAwait(false);
            }

            var figures = new List<ThroughputFigures>();
            foreach (var (sequence, sha) in loaded)
            {
                figures.Add(await ThroughputBench.MeasureAsync(fx, sequence, sha, batchCount, context.Options.SimulatorSeed, ct).ConfigureAwait(false));
            }

            if (parse.GetValue(json))
            {
                context.Output.WriteLine(JsonSerializer.Serialize(new
                {
                    fixture = fx.Id,
                    sequences = figures.Select(t => new
                    {
                        sequence = t.SequenceId,
                        units = t.Units,
                        batches = t.Batches,
                        baselineUnitsPerHour = Math.Round(t.BaselineUnitsPerHour, 2),
                        unitsPerHour = Math.Round(t.UnitsPerHour, 2),
                        boundUnitsPerHour = Math.Round(t.BoundUnitsPerHour, 2),
                        ratioToBound = Math.Round(t.RatioToBound, 3),
                        ratioToBaseline = Math.Round(t.RatioToBaseline, 2),
                        aborted = t.Aborted,
                        mode = t.Mode,
                        windowBoundUnitsPerHour = Math.Round(t.WindowBoundUnitsPerHour, 2),
                        ratioToWindowBound = Math.Round(t.RatioToWindowBound, 3),
                    }),
                    shift = EngineJson(engine, loaded[0].Sequence.Id),
                    engineOnly = EngineJson(engineOnly, loaded[0].Sequence.Id),
                }));
            }
            else
            {
                Write(context.Output, fx.Id, figures, engine, engineOnly, loaded[0].Sequence.Id);
            }

            return figures.Any(t => t.Aborted is not null) ? ExitCodes.RuntimeFailure : ExitCodes.Done;
        });
        return command;
    }

    /// <summary>The largest extrapolation uncertainty <c>--settle predictive</c> accepts unless told, °C (the demo sequences' own value).</summary>
    public const double DefaultMaxExtrapolationUncertaintyC = 0.01;

    /// <summary>
    /// <paramref name="sequence"/> with <paramref name="mode"/> in force at every setpoint (as checked as the sequence's own
    /// <c>settle</c> would be), or the sequence unchanged when no mode is given.
    /// </summary>
    public static (Core.Sequences.SequenceDefinition? Sequence, string? Problem) ForceSettle(Core.Sequences.SequenceDefinition sequence, string? mode, double maxUncertaintyC)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        if (mode is null)
        {
            return (sequence, null);
        }

        var settle = new Core.Sequences.SettleSettings
        {
            Mode = mode,
            MaxExtrapolationUncertaintyC = mode == Core.Sequences.SettleModes.Predictive ? maxUncertaintyC : null,
        };
        var forced = Core.Sequences.SettleSettings.ForAll(sequence, settle);
        var problems = new Core.Definitions.ProblemList();
        Core.Sequences.SettleRules.Check(forced, problems);
        return problems.Items.Count == 0
            ? (forced, null)
            : (null, $"--max-extrapolation-uncertainty for '{sequence.Id}': {string.Join("; ", problems.Items.Select(p => p.Reason))}");
    }

    private static object? EngineJson(EngineFigures? engine, string sequenceId) => engine is null ? null : new
    {
        sequence = sequenceId,
        units = engine.Units,
        simulatedSeconds = Math.Round(engine.SimulatedSeconds, 1),
        wallSeconds = Math.Round(engine.WallSeconds, 2),
        cpuSeconds = Math.Round(engine.CpuSeconds, 2),
        peakWorkingSetMegabytes = Math.Round(engine.PeakWorkingSetBytes / 1048576.0, 1),
        allocatedMegabytes = Math.Round(engine.AllocatedBytes / 1048576.0, 1),
        gen2Collections = engine.Gen2Collections,
        storedRuns = engine.StoredRuns,
    };

    private static void Write(TextWriter o, string fixtureId, List<ThroughputFigures> figures, EngineFigures? engine, EngineFigures? engineOnly, string shiftSequence)
    {
        var inv = CultureInfo.InvariantCulture;
        o.WriteLine($"Simulated throughput on fixture {fixtureId} (batch time only, loading left out)");
        o.WriteLine();
        o.WriteLine("sequence           settle      units  baseline u/h  LineTest u/h  bound u/h  LineTest/bound  LineTest/baseline  window bound u/h  LineTest/window bound");
        foreach (var t in figures)
        {
            o.WriteLine(string.Create(inv,
                $"{t.SequenceId,-18} {t.Mode,-10}  {t.Units,5}  {t.BaselineUnitsPerHour,12:F2}  {t.UnitsPerHour,12:F2}  {t.BoundUnitsPerHour,9:F2}  {t.RatioToBound * 100,13:F1}%  {t.RatioToBaseline,16:F2}x  {t.WindowBoundUnitsPerHour,16:F2}  {t.RatioToWindowBound,20:F2}x"));
            if (t.Aborted is not null)
            {
                o.WriteLine($"  a batch stopped: {t.Aborted}");
            }
        }

        if (engine is not null)
        {
            o.WriteLine();
            o.WriteLine(string.Create(inv,
                $"Shift of {engine.Units} units ({shiftSequence}, every run stored in a temporary database and logged): {engine.SimulatedSeconds / 3600:F1} h simulated in {engine.WallSeconds:F2} s wall, {engine.CpuSeconds:F2} s CPU"));
            o.WriteLine(string.Create(inv,
                $"  peak working set {engine.PeakWorkingSetBytes / 1048576.0:F0} MB, {engine.AllocatedBytes / 1048576.0:F0} MB allocated, {engine.Gen2Collections} full collections"));
        }

        if (engineOnly is not null)
        {
            o.WriteLine(string.Create(inv,
                $"Engine alone, {engineOnly.Units} units (runs discarded, no logging): {engineOnly.SimulatedSeconds / 3600:F1} h of batches simulated in {engineOnly.WallSeconds:F2} s wall, {engineOnly.CpuSeconds:F2} s CPU, {engineOnly.AllocatedBytes / 1048576.0:F0} MB allocated"));
        }
    }
}
