using System.Diagnostics;
using System.Globalization;
using System.Text;
using System.Text.Json;
using LineTest.Reports.Building;
using LineTest.Reports.Console;
using LineTest.Reports.Csv;
using LineTest.Reports.Html;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;
using Spectre.Console;

namespace LineTest.Reports.Fuzzing;

/// <summary>
/// Mutates readings CSVs and results databases and runs each through loading, building and every writer, as
/// <c>linetest report</c> does. The property: a report or a refusal with a reason, never an exception the command does
/// not turn into exit 1 or 2, and never more than 10 s. Seeded: the same seed gives the same inputs. The HTML page, whose
/// charts take most of the time, is made for one input in 25.
/// </summary>
public static class ReportFuzzer
{
    /// <summary>Slower than this counts as a hang.</summary>
    public static readonly TimeSpan Limit = TimeSpan.FromSeconds(10);

    private static readonly string[] Numbers =
    [
        "0", "-0", "1e160", "-1e160", "1e308", "-1.7976931348623157e308", "4.9e-324", "NaN", "Infinity", "-Infinity", "1e999",
        "2,49", "two", "", " ", "0x10", "1_000", "12e", "+-1", "٣", "1e-320", "99999999999999999999",
    ];

    private static readonly string[] Texts = ["", " ", "pass", "fail", "error", "maybe", "PASS", "yesterday", "2025-02-30T00:00:00Z", "\"", ",", "\n", "é", "\0"];

    /// <summary>A mutation of <paramref name="csv"/>: fields replaced by odd numbers or text, lines dropped, doubled or cut.</summary>
    public static string MutateCsv(string csv, Random random)
    {
        ArgumentNullException.ThrowIfNull(csv);
        ArgumentNullException.ThrowIfNull(random);
        var lines = csv.Replace("\r\n", "\n", StringComparison.Ordinal).Split('\n').ToList();
        var edits = 1 + random.Next(4);
        for (var e = 0; e < edits && lines.Count > 0; e++)
        {
            var i = random.Next(lines.Count);
            var fields = lines[i].Split(',');
            switch (random.Next(7))
            {
                case 0:
                case 1:
                    fields[random.Next(fields.Length)] = Numbers[random.Next(Numbers.Length)];
                    lines[i] = string.Join(',', fields);
                    break;
                case 2:
                    fields[random.Next(fields.Length)] = Texts[random.Next(Texts.Length)];
                    lines[i] = string.Join(',', fields);
                    break;
                case 3:
                    lines.RemoveAt(i);
                    break;
                case 4:
                    lines.Insert(i, lines[i]);
                    break;
                case 5:
                    lines[i] = lines[i][..random.Next(lines[i].Length + 1)];
                    break;
                default:
                    lines[i] = string.Join(',', fields.Append(Numbers[random.Next(Numbers.Length)]));
                    break;
            }
        }

        return string.Join('\n', lines);
    }

    /// <summary>
    /// Damages the database at <paramref name="path"/> in place: cells set to odd values behind the schema's back,
    /// rows or an index dropped, or bytes of the file overwritten.
    /// </summary>
    public static void MutateDatabase(string path, Random random)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        ArgumentNullException.ThrowIfNull(random);
        if (random.Next(5) == 0)
        {
            var bytes = File.ReadAllBytes(path);
            var flips = 1 + random.Next(8);
            for (var f = 0; f < flips && bytes.Length > 0; f++)
            {
                bytes[random.Next(bytes.Length)] = (byte)random.Next(256);
            }

            File.WriteAllBytes(path, bytes);
            return;
        }

        using var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = path, Pooling = false }.ToString());
        connection.Open();
        var edits = 1 + random.Next(3);
        for (var e = 0; e < edits; e++)
        {
            using var command = connection.CreateCommand();
            command.CommandText = "PRAGMA ignore_check_constraints = ON; " + random.Next(10) switch
            {
                0 => "DELETE FROM runs WHERE seq = (SELECT seq FROM runs ORDER BY random() LIMIT 1);",
                1 => "DELETE FROM readings WHERE run_seq IN (SELECT run_seq FROM readings ORDER BY random() LIMIT 3);",
                2 => "DROP INDEX IF EXISTS ix_runs_summary;",
                3 or 4 or 5 => $"UPDATE readings SET {Pick(random, "value", "low", "high", "name", "unit")} = $v WHERE run_seq = (SELECT run_seq FROM readings ORDER BY random() LIMIT 1) AND ordinal = {random.Next(6)};",
                _ => $"UPDATE runs SET {Pick(random, "verdict", "ended_utc", "serial", "station", "slot", "lot", "sequence_id", "sequence_revision", "id", "reason", "first_failing_reading")} = $v WHERE seq = (SELECT seq FROM runs ORDER BY random() LIMIT 1);",
            };
            command.Parameters.AddWithValue("$v", OddValue(random));
            try
            {
                command.ExecuteNonQuery();
            }
            catch (SqliteException)
            {
                // A constraint the mutation ran into (e.g. NOT NULL): that damage is not possible, try the next.
            }
        }
    }

    /// <summary>Runs one CSV text through the report path; never throws.</summary>
    public static FuzzOutcome RunCsv(string csv, bool skipBadRows, out string? crash) => RunCsv(csv, skipBadRows, DefaultHtmlEvery, out crash);

    private static FuzzOutcome RunCsv(string csv, bool skipBadRows, int htmlEvery, out string? crash)
    {
        crash = null;
        try
        {
            var loaded = CsvReadingsLoader.Load(new StringReader(csv), "fuzz.csv", ReportQuery.All, skipBadRows);
            if (loaded.Data is null)
            {
                return FuzzOutcome.Refused;
            }

            WriteEveryFormat(loaded.Data, htmlEvery);
            return FuzzOutcome.Reported;
        }
        catch (Exception ex)
        {
            crash = Describe(ex);
            return FuzzOutcome.Crashed;
        }
    }

    /// <summary>
    /// Runs one results folder through the report path; never throws. With <paramref name="skipBadRows"/> damaged runs
    /// are left out (<c>--skip-bad-rows</c>), and each must be named in the report. The HTML page is made for one input
    /// in <paramref name="htmlEvery"/> (0: never).
    /// </summary>
    private static FuzzOutcome RunDatabase(string resultsDirectory, bool skipBadRows, int htmlEvery, out string? crash)
    {
        crash = null;
        try
        {
            var data = ResultsLoader.LoadAsync([resultsDirectory], ReportQuery.All, skipBadRows).GetAwaiter().GetResult();
            var json = WriteEveryFormat(data, htmlEvery);
            using var document = JsonDocument.Parse(json);
            var named = document.RootElement.GetProperty("skippedRows").EnumerateArray().Select(e => e.GetString()).ToHashSet(StringComparer.Ordinal);
            if (data.SkippedRows.Any(row => !named.Contains(row)))
            {
                crash = "a skipped damaged run is not named in the JSON report";
                return FuzzOutcome.Crashed;
            }

            return FuzzOutcome.Reported;
        }
        catch (ResultStoreException)
        {
            return FuzzOutcome.Refused;
        }
        catch (Exception ex)
        {
            crash = Describe(ex);
            return FuzzOutcome.Crashed;
        }
    }

    /// <summary>
    /// Fuzzes <paramref name="iterations"/> mutations of a readings CSV on <paramref name="workers"/> threads, each with its own seeded
    /// generator (worker 0 draws what one worker draws), so the inputs depend on the seed and the worker count only.
    /// The HTML page is made for one input in <paramref name="htmlEvery"/> (0: never).
    /// </summary>
    public static FuzzSummary FuzzCsv(string csv, int iterations, int seed, int workers, int htmlEvery) =>
        Run("csv", iterations, workers, worker =>
        {
            var random = WorkerRandom(seed, worker);
            return () =>
            {
                var skip = random.Next(2) == 0;
                var outcome = RunCsv(MutateCsv(csv, random), skip, htmlEvery, out var crash);
                return (outcome, crash);
            };
        });

    /// <summary>Fuzzes <paramref name="iterations"/> damaged copies of the results database in <paramref name="resultsDirectory"/>.</summary>
    public static FuzzSummary FuzzDatabase(string resultsDirectory, int iterations, int seed) => FuzzDatabase(resultsDirectory, iterations, seed, workers: 1, DefaultHtmlEvery);

    /// <summary>
    /// As <see cref="FuzzDatabase(string, int, int)"/> on <paramref name="workers"/> threads: the database is read once
    /// into memory and each input is a fresh copy written to the worker's own scratch folder (under the temporary folder:
    /// set <c>TMPDIR</c> to a memory file system such as /dev/shm to keep the disk out of it), damaged, then reported
    /// on, half of the inputs with damaged runs skipped. The HTML page is made for one input in <paramref name="htmlEvery"/>
    /// (0: never).
    /// </summary>
    public static FuzzSummary FuzzDatabase(string resultsDirectory, int iterations, int seed, int workers, int htmlEvery)
    {
        var original = File.ReadAllBytes(ResultsDatabase.PathIn(resultsDirectory));
        var scratches = Enumerable.Range(0, Math.Max(1, workers)).Select(_ => Directory.CreateTempSubdirectory("linetest-fuzz-db-")).ToList();
        try
        {
            return Run("database", iterations, workers, worker =>
            {
                var random = WorkerRandom(seed, worker);
                var scratch = scratches[worker];
                return () =>
                {
                    var path = ResultsDatabase.PathIn(scratch.FullName);
                    foreach (var file in scratch.GetFiles())
                    {
                        file.Delete();
                    }

                    File.WriteAllBytes(path, original);
                    MutateDatabase(path, random);
                    var skip = random.Next(2) == 0;
                    var outcome = RunDatabase(scratch.FullName, skip, htmlEvery, out var crash);
                    return (outcome, crash);
                };
            });
        }
        finally
        {
            foreach (var scratch in scratches)
            {
                scratch.Delete(recursive: true);
            }
        }
    }

    private static Random WorkerRandom(int seed, int worker) => new(worker == 0 ? seed : HashCode.Combine(seed, worker));

    private static FuzzSummary Run(string kind, int iterations, int workers, Func<int, Func<(FuzzOutcome Outcome, string? Crash)>> worker)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(iterations, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(workers, 1);
        var parts = new FuzzSummary[workers];
        Parallel.For(0, workers, new ParallelOptions { MaxDegreeOfParallelism = workers }, w =>
        {
            // Worker w takes inputs w, w + workers, …: every worker gets its share whatever the count.
            var once = worker(w);
            var share = (iterations - w + workers - 1) / workers;
            parts[w] = share == 0 ? new FuzzSummary(kind, 0, 0, 0, 0, 0, 0, null) : RunShare(kind, share, once);
        });
        return new FuzzSummary(
            kind,
            parts.Sum(p => p.Inputs),
            parts.Sum(p => p.Reported),
            parts.Sum(p => p.Refused),
            parts.Sum(p => p.Crashed),
            parts.Sum(p => p.OverTenSeconds),
            parts.Max(p => p.SlowestSeconds),
            parts.Select(p => p.FirstCrash).FirstOrDefault(c => c is not null),
            parts.Max(p => p.SlowestCpuSeconds));
    }

    private static FuzzSummary RunShare(string kind, int iterations, Func<(FuzzOutcome Outcome, string? Crash)> once)
    {
        int reported = 0, refused = 0, crashed = 0, slow = 0;
        double slowest = 0, slowestCpu = 0;
        string? first = null;
        for (var i = 0; i < iterations; i++)
        {
            var cpu = Environment.CpuUsage.TotalTime;
            var started = Stopwatch.GetTimestamp();
            var (outcome, crash) = once();
            var seconds = Stopwatch.GetElapsedTime(started).TotalSeconds;
            slowestCpu = Math.Max(slowestCpu, (Environment.CpuUsage.TotalTime - cpu).TotalSeconds);
            slowest = Math.Max(slowest, seconds);
            slow += seconds > Limit.TotalSeconds ? 1 : 0;
            switch (outcome)
            {
                case FuzzOutcome.Reported:
                    reported++;
                    break;
                case FuzzOutcome.Refused:
                    refused++;
                    break;
                default:
                    crashed++;
                    first ??= crash;
                    break;
            }
        }

        return new FuzzSummary(kind, iterations, reported, refused, crashed, slow, slowest, first, slowestCpu);
    }

    // Charts cost most of an input's time (PNG rendering), so the HTML page is made for one input in DefaultHtmlEvery; the
    // other formats for every input.
    private const int DefaultHtmlEvery = 25;

    private static int _written;

    /// <summary>Writes every format; returns the JSON.</summary>
    private static string WriteEveryFormat(ReportData data, int htmlEvery)
    {
        var report = ReportBuilder.Build(data, ReportQuery.All, TimeProvider.System);
        var json = ReportJsonWriter.ToJson(report);
        ReadingStatisticsCsvWriter.Write(report, TextWriter.Null);
        if (htmlEvery > 0 && Interlocked.Increment(ref _written) % htmlEvery == 1 % htmlEvery)
        {
            _ = HtmlReportWriter.ToHtml(report);
        }

        var console = AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(new StringWriter(CultureInfo.InvariantCulture)), Ansi = AnsiSupport.No });
        ReportConsoleWriter.Write(report, console, plain: true);
        return json;
    }

    private static string Pick(Random random, params string[] options) => options[random.Next(options.Length)];

    private static object OddValue(Random random) => random.Next(6) switch
    {
        0 => Numbers[random.Next(Numbers.Length)],
        1 => Texts[random.Next(Texts.Length)],
        2 => double.Parse(Numbers[random.Next(3)], CultureInfo.InvariantCulture),
        3 => (object)random.Next(-5, 1000),
        4 => new byte[] { 0xff, 0x00, 0x41 },
        _ => Encoding.UTF8.GetString([0xC3, 0x28]),
    };

    /// <summary>
    /// A crash as its type, message and where it came from: the first frame in this program's own code (a library's frame
    /// alone, such as the SQLite reader's, does not say which call to fix), else the frame that threw.
    /// </summary>
    internal static string Describe(Exception ex)
    {
        var frames = ex.StackTrace?.Split('\n', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries) ?? [];
        var frame = frames.FirstOrDefault(f => f.StartsWith("at LineTest.", StringComparison.Ordinal)) ?? frames.FirstOrDefault();
        return frame is null ? $"{ex.GetType().Name}: {ex.Message}" : $"{ex.GetType().Name}: {ex.Message} ({frame})";
    }
}
