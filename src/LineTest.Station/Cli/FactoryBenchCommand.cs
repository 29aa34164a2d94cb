using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using LineTest.Factory.Reporting;
using LineTest.Factory.Schema;
using LineTest.Reports.Building;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
using LineTest.Station.Demo;
using Npgsql;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest bench-factory --factory CONN --mode forward|report</c>: forwarding throughput from several stations at
/// once, or a factory report over many runs against the plain SQL aggregate. Needs an empty database it may fill.
/// </summary>
public static class FactoryBenchCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var factory = new Option<string>("--factory") { Description = "An empty PostgreSQL database the benchmark may fill (Npgsql connection string)", Required = true };
        var mode = new Option<string>("--mode") { Description = "forward or report", DefaultValueFactory = _ => "forward" };
        mode.AcceptOnlyFromAmong("forward", "report");
        var stations = new Option<int>("--stations") { Description = "forward: stations forwarding at once", DefaultValueFactory = _ => 10 };
        var runs = new Option<int>("--runs") { Description = "forward: runs per station; report: runs in the database", DefaultValueFactory = _ => 1000 };
        var readings = new Option<int>("--readings") { Description = "forward: readings per run", DefaultValueFactory = _ => 20 };
        var existing = new Option<bool>("--existing")
        {
            Description = "report: measure over the runs already in the database (filled by an earlier report benchmark) instead of filling an empty one",
        };
        var command = new Command("bench-factory", "Factory database benchmarks: forwarding throughput, report against the SQL floor") { factory, mode, stations, runs, readings, existing };
        command.SetAction(async (parse, ct) =>
        {
            NpgsqlDataSource dataSource;
            try
            {
                dataSource = FactoryConnection.Create(parse.GetValue(factory)!);
            }
            catch (ArgumentException ex)
            {
                return context.BadInput($"--factory is not a usable connection string: {ex.Message}");
            }

            await using var owned = dataSource;
            var inv = CultureInfo.InvariantCulture;
            try
            {
                await FactoryMigrations.ApplyAsync(dataSource, ct).ConfigureAwait(false);
                await using (var count = dataSource.CreateCommand("SELECT count(*) FROM run_ids;"))
                await using (var count2 = dataSource.CreateCommand("SELECT count(*) FROM runs;"))
                {
                    var reuse = parse.GetValue(existing) && parse.GetValue(mode) == "report";
                    if (!reuse && (long)(await count.ExecuteScalarAsync(ct).ConfigureAwait(false))! + (long)(await count2.ExecuteScalarAsync(ct).ConfigureAwait(false))! > 0)
                    {
                        return context.BadInput($"{FactoryConnection.Describe(dataSource)} already holds runs; the benchmark needs an empty database");
                    }
                }

                if (parse.GetValue(mode) == "forward")
                {
                    var folder = Path.Combine(Path.GetTempPath(), "linetest-bench-factory-" + Guid.NewGuid().ToString("N")[..8]);
                    var (forwarded, seconds) = await FactoryBench.ForwardingAsync(
                        dataSource, folder, parse.GetValue(stations), parse.GetValue(runs), parse.GetValue(readings), ct).ConfigureAwait(false);
                    Directory.Delete(folder, recursive: true);
                    context.Output.WriteLine(string.Create(inv, $"forwarded {forwarded} runs ({parse.GetValue(readings)} readings each) from {parse.GetValue(stations)} stations at once in {seconds:F2} s: {forwarded / seconds:F0} runs/s"));
                    return ExitCodes.Done;
                }

                if (!parse.GetValue(existing))
                {
                    var total = parse.GetValue(runs);
                    var fill = await FactoryBench.FillAsync(dataSource, total, ct).ConfigureAwait(false);
                    context.Output.WriteLine(string.Create(inv, $"filled {total} runs x 5 readings in {fill:F1} s"));
                }

                var (packs, packedRuns, packTime) = await FactoryReportLoader.BuildPacksAsync(dataSource, ct).ConfigureAwait(false);
                context.Output.WriteLine(string.Create(inv, $"packs of runs built: {packs} packs ({packedRuns} runs) in {packTime.TotalSeconds:F1} s{(packs == 0 ? " (already current)" : string.Empty)}"));
                // The floor is run three times and its median taken: its parallel workers make one run vary by a third.
                var floors = new List<double>();
                for (var i = 0; i < 3; i++)
                {
                    floors.Add(await FactoryBench.FloorAsync(dataSource, ct).ConfigureAwait(false));
                }

                var floor = floors.Order().ElementAt(1);
                context.Output.WriteLine(string.Create(inv, $"floor (plain SQL aggregate: yield counts, per-reading count/mean/sd/min/max): {floor:F2} s, the median of {string.Join(" / ", floors.Select(f => f.ToString("F2", inv)))} s"));
                var jitBefore = System.Runtime.JitInfo.GetCompilationTime();
                var jitMethodsBefore = System.Runtime.JitInfo.GetCompiledMethodCount();
                var watch = Stopwatch.StartNew();
                var times = new FactoryLoadTimes();
                var data = await FactoryReportLoader.LoadPackedAsync(dataSource, ReportQuery.All, times, ct: ct).ConfigureAwait(false);
                var loaded = watch.Elapsed.TotalSeconds;
                var report = ReportBuilder.Build(data, ReportQuery.All, context.Clock);
                var built = watch.Elapsed.TotalSeconds;
                // Written as report --json writes it: as it is produced, into a text writer (here one that counts).
                var json = new CountingWriter();
                ReportJsonWriter.Write(report, json);
                watch.Stop();
                using var process = Process.GetCurrentProcess();
                context.Output.WriteLine(string.Create(
                    inv,
                    $"report --factory --json over {data.Runs.Count} runs: {watch.Elapsed.TotalSeconds:F2} s (load {loaded:F2} s, statistics {built - loaded:F2} s, JSON {watch.Elapsed.TotalSeconds - built:F2} s), {json.Count / 1024} KiB of JSON, peak working set {process.PeakWorkingSet64 / (1024 * 1024)} MB; {watch.Elapsed.TotalSeconds / floor:F1} x the floor"));
                context.Output.WriteLine(string.Create(
                    inv,
                    $"  garbage collections {GC.CollectionCount(0)}/{GC.CollectionCount(1)}/{GC.CollectionCount(2)} (gen 0/1/2), paused {GC.GetTotalPauseDuration().TotalSeconds:F2} s; processor time of this process {process.TotalProcessorTime.TotalSeconds:F2} s; while reporting, {System.Runtime.JitInfo.GetCompiledMethodCount() - jitMethodsBefore} methods compiled in {(System.Runtime.JitInfo.GetCompilationTime() - jitBefore).TotalSeconds:F2} s"));
                context.Output.WriteLine(string.Create(
                    inv,
                    $"  load, from its start: packs of runs current {times.PacksBuilt.TotalSeconds:F2} s ({times.PacksWritten} written), read from {(times.FromPacks ? "the packs" : "the rows")}; {(times.FromPacks ? "packs read" : "runs read")} {times.RunsRead.TotalSeconds:F2} s, {(times.FromPacks ? "runs ordered" : "readings read")} {times.ReadingsRead.TotalSeconds:F2} s, placed in run order {times.ReadingsPlaced.TotalSeconds:F2} s, yield count received {times.YieldCounted.TotalSeconds:F2} s"));
                return ExitCodes.Done;
            }
            catch (Exception ex) when (ex is NpgsqlException or FactorySchemaException)
            {
                context.Error.WriteLine($"linetest: {FactoryConnection.Describe(dataSource)}: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }
            catch (InvalidDataException ex)
            {
                return context.BadInput($"{FactoryConnection.Describe(dataSource)}: {ex.Message}");
            }
        });
        return command;
    }

    /// <summary>A text writer that keeps nothing and counts the UTF-8 bytes of what is written.</summary>
    private sealed class CountingWriter : TextWriter
    {
        public long Count { get; private set; }

        public override System.Text.Encoding Encoding => System.Text.Encoding.UTF8;

        public override void Write(char value) => Count++;

        public override void Write(char[] buffer, int index, int count) => Write(buffer.AsSpan(index, count));

        // Counted as the bytes standard output would encode, which costs what the encoding costs.
        public override void Write(ReadOnlySpan<char> buffer) => Count += Encoding.GetByteCount(buffer);
    }
}
