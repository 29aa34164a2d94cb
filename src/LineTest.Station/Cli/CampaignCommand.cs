using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using LineTest.Core.Sequences;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Campaign;
using LineTest.Station.Composition;
using LineTest.Storage.Store;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest campaign --units N --fault-rate R [--seed K] [--results DIR] [--json]</c>: simulated batches with faults
/// injected at rate R per batch, audited against the simulator's ground truth. <c>--fuzz ITERATIONS</c> instead runs
/// that many damaged sequence and fixture files through the loaders and ITERATIONS/100 (at least one) batches on
/// instruments that reply with garbage. Exit 0 when every must-be-zero figure is zero, 1 otherwise, 2 bad input.
/// </summary>
public static class CampaignCommand
{
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web);

    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var units = new Option<int>("--units") { Description = "Units to test", DefaultValueFactory = _ => 200 };
        var rate = new Option<double>("--fault-rate") { Description = "Probability per batch that one fault is injected (0 to 1)", DefaultValueFactory = _ => 0.2 };
        var seed = new Option<int>("--seed") { Description = "Seed of the simulator and of the fault draws", DefaultValueFactory = _ => 4040 };
        var results = new Option<string?>("--results") { Description = "Results folder (default: a new folder under the temporary folder)" };
        var json = new Option<bool>("--json") { Description = "Print the figures as one JSON object" };
        var fuzz = new Option<int?>("--fuzz") { Description = "Fuzz instead: damaged definition files to load (and one garbage batch per 100)" };
        var fuzzFiles = new Option<int?>("--fuzz-files")
        {
            Description = "Fuzz definition files instead: N damaged sequence and N damaged fixture files through what check runs",
        };
        var sequence = new Option<string?>("--sequence") { Description = "Sequence file (default: the station's)" };
        var fixture = new Option<string?>("--fixture") { Description = "Simulated fixture file (default: the station's)" };
        var settle = new Option<string?>("--settle")
        {
            Description = "Settle every setpoint in this mode (window or predictive, the latter with bench's default extrapolation limit) instead of as the sequence says",
        };
        var command = new Command("campaign", "Inject instrument and unit faults into simulated batches and audit what was stored")
        {
            units, rate, seed, results, json, fuzz, fuzzFiles, sequence, fixture, settle,
        };
        command.SetAction(async (parse, ct) =>
        {
            var fixturePath = parse.GetValue(fixture) is { } f ? Path.GetFullPath(f) : ContentRoot.Resolve(context.Root, context.Options.Fixture);
            var sequencePath = parse.GetValue(sequence) is { } s ? Path.GetFullPath(s) : ContentRoot.Resolve(context.Root, context.Options.Sequence);
            var fixtureResult = DefinitionFiles.LoadFixture(fixturePath, context.Error);
            if (!fixtureResult.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            var fx = fixtureResult.Value!;
            if (fx.Rig != "simulator")
            {
                return context.BadInput($"fixture '{fx.Id}' drives real instruments; a campaign needs a simulator fixture");
            }

            var sequenceResult = DefinitionFiles.LoadSequence(sequencePath, fx, context.Error);
            if (!sequenceResult.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            var settleMode = parse.GetValue(settle);
            if (settleMode is not null && !SettleModes.All.Contains(settleMode, StringComparer.Ordinal))
            {
                return context.BadInput($"--settle must be {string.Join(" or ", SettleModes.All)}, not '{settleMode}'");
            }

            var forced = BenchCommand.ForceSettle(sequenceResult.Value!, settleMode, BenchCommand.DefaultMaxExtrapolationUncertaintyC);
            if (forced.Problem is { } problem)
            {
                return context.BadInput(problem);
            }

            var seq = forced.Sequence!;
            if (SimulatedUnitDesign.ForProduct(seq.Product) is null)
            {
                return context.BadInput($"sequence '{seq.Id}' tests '{seq.Product}', which the simulator does not build");
            }

            var asJson = parse.GetValue(json);
            if (parse.GetValue(fuzzFiles) is { } files)
            {
                if (files < 1)
                {
                    return context.BadInput($"--fuzz-files must be 1 or more, not {files}");
                }

                var fileFuzzer = new FileFuzzer(fx, await File.ReadAllBytesAsync(fixturePath, ct).ConfigureAwait(false),
                    await File.ReadAllBytesAsync(sequencePath, ct).ConfigureAwait(false), parse.GetValue(seed));
                var fileSummary = fileFuzzer.Run(files, ct);
                context.Output.WriteLine(asJson ? JsonSerializer.Serialize(fileSummary, Json) : FileFuzzText(fileSummary));
                return fileSummary.Crashes + fileSummary.OverTenSeconds == 0 ? ExitCodes.Done : ExitCodes.RuntimeFailure;
            }

            if (parse.GetValue(fuzz) is { } iterations)
            {
                if (iterations < 1)
                {
                    return context.BadInput($"--fuzz must be 1 or more, not {iterations}");
                }

                var fuzzer = new Fuzzer(fx, await File.ReadAllBytesAsync(fixturePath, ct).ConfigureAwait(false), seq,
                    await File.ReadAllBytesAsync(sequencePath, ct).ConfigureAwait(false), sequenceResult.Sha256!, parse.GetValue(seed));
                var found = await fuzzer.RunAsync(iterations, Math.Max(1, iterations / 100), ct).ConfigureAwait(false);
                context.Output.WriteLine(asJson ? JsonSerializer.Serialize(found, Json) : FuzzText(found));
                return found.LoaderCrashes + found.ProblemsWithoutLocation + found.UnhandledInBatches + found.UnitsWithoutVerdict == 0
                    ? ExitCodes.Done
                    : ExitCodes.RuntimeFailure;
            }

            var unitCount = parse.GetValue(units);
            var faultRate = parse.GetValue(rate);
            if (unitCount < 1)
            {
                return context.BadInput($"--units must be 1 or more, not {unitCount}");
            }

            if (!(faultRate >= 0 && faultRate <= 1))
            {
                return context.BadInput($"--fault-rate must be between 0 and 1, not {faultRate.ToString(CultureInfo.InvariantCulture)}");
            }

            var folder = parse.GetValue(results) is { } r
                ? Path.GetFullPath(r)
                : Path.Combine(Path.GetTempPath(), $"linetest-campaign-{parse.GetValue(seed)}-{Guid.NewGuid():N}");
            using var writer = WriterLock.TakeOrRefuse(folder, context.Clock, context.Error);
            if (writer is null)
            {
                return ExitCodes.RuntimeFailure;
            }

            var campaign = new FaultCampaign(new CampaignOptions
            {
                Fixture = fx,
                Sequence = seq,
                SequenceSha256 = sequenceResult.Sha256!,
                Units = unitCount,
                FaultRate = faultRate,
                Seed = parse.GetValue(seed),
                ResultsDirectory = folder,
                Station = context.Options.Id,
            });
            CampaignSummary summary;
            try
            {
                summary = await campaign.RunAsync(ct).ConfigureAwait(false);
            }
            catch (Exception ex) when (ex is ResultStoreException or RunStorageException)
            {
                context.Error.WriteLine($"linetest: results could not be stored, the campaign was stopped: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }

            context.Output.WriteLine(asJson ? JsonSerializer.Serialize(summary, Json) : CampaignText(summary));
            return summary.WrongPasses + summary.LostRuns + summary.RunsWithoutVerdict + summary.SourceLeftAwayFromStandby + summary.DuplicateRuns == 0
                ? ExitCodes.Done
                : ExitCodes.RuntimeFailure;
        });
        return command;
    }

    private static string CampaignText(CampaignSummary s) => string.Join(Environment.NewLine,
    [
        string.Create(CultureInfo.InvariantCulture, $"Units {s.Units} in {s.Batches} batches; {s.FaultedBatches} batches with a fault ({string.Join(", ", s.FaultsByKind.Select(p => $"{p.Key} {p.Value}"))}), {s.AbortedBatches} stopped"),
        string.Create(CultureInfo.InvariantCulture, $"Verdicts: {s.Pass} pass, {s.Fail} fail, {s.Error} error"),
        string.Create(CultureInfo.InvariantCulture, $"Wrong passes {s.WrongPasses}, lost runs {s.LostRuns}, duplicate runs {s.DuplicateRuns}, runs without a verdict {s.RunsWithoutVerdict}, source left away from standby {s.SourceLeftAwayFromStandby}"),
        string.Create(CultureInfo.InvariantCulture, $"Simulated {s.SimulatedSeconds / 3600:F1} h, wall {s.WallSeconds:F1} s; results in {s.ResultsPath}"),
    ]);

    private static string FileFuzzText(FileFuzzSummary s) => string.Join(Environment.NewLine,
    [
        string.Create(CultureInfo.InvariantCulture, $"Damaged files checked: {s.Sequences} sequences and {s.Fixtures} fixtures; {s.Loaded} loaded, {s.Refused} refused with problems"),
        string.Create(CultureInfo.InvariantCulture, $"Crashes {s.Crashes}, over 10 s {s.OverTenSeconds}, slowest {s.SlowestMilliseconds:F1} ms"),
        .. s.FirstCrashes.Select(c => $"  crash: {c}"),
        string.Create(CultureInfo.InvariantCulture, $"Wall {s.WallSeconds:F1} s"),
    ]);

    private static string FuzzText(FuzzSummary s) => string.Join(Environment.NewLine,
    [
        string.Create(CultureInfo.InvariantCulture, $"Damaged files {s.LoaderCases}: {s.Loaded} loaded, {s.Refused} refused with problems, {s.LoaderCrashes} crashes, {s.ProblemsWithoutLocation} problems without a location"),
        string.Create(CultureInfo.InvariantCulture, $"Garbage batches {s.GarbageBatches} ({s.GarbageReplies} garbage replies): {s.Units} units, {s.Pass} pass, {s.Fail} fail, {s.Error} error; {s.UnhandledInBatches} unhandled, {s.UnitsWithoutVerdict} without a verdict, {s.WrongPasses} wrong passes; {s.ReachedTrim} reached trim, {s.ReachedVerify} reached verify"),
        .. s.FirstCrashes.Select(c => $"  crash: {c}"),
        string.Create(CultureInfo.InvariantCulture, $"Wall {s.WallSeconds:F1} s"),
    ]);
}
