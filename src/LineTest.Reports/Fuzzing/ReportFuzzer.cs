using System.Diagnostics;
using System.Globalization;
using System.Text;
using LineTest.Reports.Building;
using LineTest.Reports.Console;
using LineTest.Reports.Csv;
using LineTest.Reports.Html;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
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
    public static FuzzOutcome RunCsv(string csv, bool skipBadRows, out string? crash)
    {
        crash = null;
        try
        {
            var loaded = CsvReadingsLoader.Load(new StringReader(csv), "fuzz.csv", ReportQuery.All, skipBadRows);
            if (loaded.Data is null)
            {
                return FuzzOutcome.Refused;
            }

            WriteEveryFormat(loaded.Data);
            return FuzzOutcome.Reported;
        }
        catch (Exception ex)
        {
            crash = $"{ex.GetType().Name}: {ex.Message}";
            return FuzzOutcome.Crashed;
        }
    }

    /// <summary>Runs one results folder through the report path; never throws.</summary>
    public static FuzzOutcome RunDatabase(string resultsDirectory, out string? crash)
    {
        crash = null;
        try
        {
            var data = ResultsLoader.LoadAsync([resultsDirectory], ReportQuery.All).GetAwaiter().GetResult();
            WriteEveryFormat(data);
            return FuzzOutcome.Reported;
        }
        catch (ResultStoreException)
        {
            return FuzzOutcome.Refused;
        }
        catch (Exception ex)
        {
            crash = $"{ex.GetType().Name}: {ex.Message}";
            return FuzzOutcome.Crashed;
        }
    }

    /// <summary>Fuzzes <paramref name="iterations"/> mutations of a readings CSV.</summary>
    public static FuzzSummary FuzzCsv(string csv, int iterations, int seed)
    {
        var random = new Random(seed);
        return Run("csv", iterations, () =>
        {
            var skip = random.Next(2) == 0;
            var outcome = RunCsv(MutateCsv(csv, random), skip, out var crash);
            return (outcome, crash);
        });
    }

    /// <summary>Fuzzes <paramref name="iterations"/> damaged copies of the results database in <paramref name="resultsDirectory"/>.</summary>
    public static FuzzSummary FuzzDatabase(string resultsDirectory, int iterations, int seed)
    {
        var random = new Random(seed);
        var original = File.ReadAllBytes(ResultsDatabasePath(resultsDirectory));
        var scratch = Directory.CreateTempSubdirectory("linetest-fuzz-db-");
        try
        {
            return Run("database", iterations, () =>
            {
                var path = ResultsDatabasePath(scratch.FullName);
                foreach (var file in scratch.GetFiles())
                {
                    file.Delete();
                }

                File.WriteAllBytes(path, original);
                MutateDatabase(path, random);
                SqliteConnection.ClearAllPools();
                var outcome = RunDatabase(scratch.FullName, out var crash);
                return (outcome, crash);
            });
        }
        finally
        {
            SqliteConnection.ClearAllPools();
            scratch.Delete(recursive: true);
        }
    }

    private static string ResultsDatabasePath(string directory) => Path.Combine(directory, "results.db");

    private static FuzzSummary Run(string kind, int iterations, Func<(FuzzOutcome Outcome, string? Crash)> once)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(iterations, 1);
        int reported = 0, refused = 0, crashed = 0, slow = 0;
        double slowest = 0;
        string? first = null;
        for (var i = 0; i < iterations; i++)
        {
            var started = Stopwatch.GetTimestamp();
            var (outcome, crash) = once();
            var seconds = Stopwatch.GetElapsedTime(started).TotalSeconds;
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

        return new FuzzSummary(kind, iterations, reported, refused, crashed, slow, slowest, first);
    }

    // Charts cost most of an input's time (PNG rendering), so the HTML page is made for one input in HtmlEvery; the
    // other formats for every input.
    private const int HtmlEvery = 25;

    private static int _written;

    private static void WriteEveryFormat(ReportData data)
    {
        var report = ReportBuilder.Build(data, ReportQuery.All, TimeProvider.System);
        _ = ReportJsonWriter.ToJson(report);
        ReadingStatisticsCsvWriter.Write(report, TextWriter.Null);
        if (Interlocked.Increment(ref _written) % HtmlEvery == 1)
        {
            _ = HtmlReportWriter.ToHtml(report);
        }

        var console = AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(new StringWriter(CultureInfo.InvariantCulture)), Ansi = AnsiSupport.No });
        ReportConsoleWriter.Write(report, console, plain: true);
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
}
