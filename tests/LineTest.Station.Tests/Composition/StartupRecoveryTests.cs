using System.Diagnostics;
using System.Text;
using LineTest.Storage.Chain;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Tests.Composition;

/// <summary>
/// Kills a real <c>linetest demo</c> process at random moments (as a crash or a power cut would stop it) and restarts it
/// on the same results folder: nothing stored may change or vanish, nothing may be counted twice, and every run cut
/// short must come back as an interrupted error with the readings it had.
/// </summary>
public sealed class StartupRecoveryTests
{
    private const int Kills = 10;

    [Fact]
    public async Task Demo_KilledAtRandomMomentsAndRestarted_KeepsEveryEndedRunAndRecoversTheInterruptedOnes()
    {
        var results = Some.TempDirectory();
        var database = ResultsDatabase.PathIn(results);
        var random = new Random(2612);
        var before = new List<string>();
        var recoveredTotal = 0;
        var trace = new StringBuilder();
        var expectedRecovery = new List<string>();
        for (var kill = 0; kill <= Kills; kill++)
        {
            var last = kill == Kills;
            var (output, exit) = await RunDemoAsync(results, seed: 100 + kill, killAfter: last ? null : TimeSpan.FromMilliseconds(random.Next(0, 700)));
            var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
            var recovered = lines.FirstOrDefault(l => l.StartsWith("Recovered ", StringComparison.Ordinal)) is { } r ? int.Parse(r.Split(' ')[1], System.Globalization.CultureInfo.InvariantCulture) : 0;
            var ended = lines.Count(l => l.StartsWith("CTP40A-", StringComparison.Ordinal));
            Assert.True(recovered <= expectedRecovery.Count, $"kill {kill}: {recovered} recovered, {expectedRecovery.Count} were in progress");
            recoveredTotal += recovered;
            if (last)
            {
                Assert.Equal(0, exit);
                Assert.Equal(expectedRecovery.Count, recovered);
            }

            if (!File.Exists(database))
            {
                // Killed before the database was created.
                Assert.Empty(before);
                continue;
            }

            using var connection = new SqliteConnection($"Data Source={database};Mode=ReadOnly;Pooling=False");
            connection.Open();
            Assert.Equal("ok", Scalar(connection, "PRAGMA integrity_check;"));
            var chain = await ChainVerifier.VerifyAsync(database);
            Assert.True(chain.IsIntact, chain.FirstProblem?.Message);
            var now = Column(connection, "SELECT record_sha256 FROM runs ORDER BY seq;");

            // Every run that had ended before the kill is still there, unchanged, in the same place.
            Assert.True(now.Count >= before.Count, $"kill {kill}: {before.Count} runs before, {now.Count} after");
            Assert.Equal(before, now.Take(before.Count));

            // Every unit line the process printed belongs to a stored run, and so does every recovered run.
            Assert.True(now.Count - before.Count >= ended + recovered, $"kill {kill}: {ended} ended and {recovered} recovered, {now.Count - before.Count} stored");

            // Nothing counted twice: ids unique, and no run both finished and still in progress.
            Assert.Equal(Scalar(connection, "SELECT count(*) FROM runs;"), Scalar(connection, "SELECT count(DISTINCT id) FROM runs;"));
            Assert.Equal(0L, Scalar(connection, "SELECT count(*) FROM runs_in_progress WHERE id IN (SELECT id FROM runs);"));
            Assert.Equal(0L, Scalar(connection, "SELECT count(*) FROM runs WHERE verdict NOT IN ('pass', 'fail', 'error');"));
            // Each run the last kill left in progress is now either stored as interrupted or still in progress (this
            // process was killed before it got to it), never both, never gone.
            var journal = Column(connection, "SELECT id FROM runs_in_progress;");
            var interrupted = Column(connection, "SELECT id FROM runs WHERE verdict = 'error' AND reason = 'interrupted';");
            foreach (var id in expectedRecovery)
            {
                Assert.True(journal.Contains(id) ^ interrupted.Contains(id), $"kill {kill}: run {id} was in progress before and is now lost or doubled");
            }

            expectedRecovery = journal;
            trace.AppendLine($"kill {kill}: exit {exit}, {ended} ended, {recovered} recovered, {now.Count} runs, {journal.Count} in progress");
            before = now;
        }

        using var final = new SqliteConnection($"Data Source={database};Mode=ReadOnly;Pooling=False");
        final.Open();
        Assert.Equal(0L, Scalar(final, "SELECT count(*) FROM runs_in_progress;"));
        // A process may be killed after storing a recovered run and before printing so: at least as many as printed.
        var stored = (long)Scalar(final, "SELECT count(*) FROM runs WHERE reason = 'interrupted';")!;
        Assert.True(stored >= recoveredTotal, $"{recoveredTotal} recoveries printed, {stored} stored");
        Assert.True(stored > 0, $"at least one kill should land mid-batch (a batch takes most of each process's life):\n{trace}");
    }

    private static async Task<(string Output, int Exit)> RunDemoAsync(string results, int seed, TimeSpan? killAfter)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = Some.TempDirectory(),
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var arg in new[] { Path.Combine(AppContext.BaseDirectory, "linetest.dll"), "demo", "--units", "16", "--seed", seed.ToString(System.Globalization.CultureInfo.InvariantCulture), "--results", results })
        {
            start.ArgumentList.Add(arg);
        }

        start.Environment["LINETEST_Serilog__MinimumLevel__Default"] = "Warning";
        start.Environment["LINETEST_Station__Id"] = "ST-KILL";
        var writtenBefore = LastWrite(results);
        using var process = new Process { StartInfo = start };
        var output = new StringBuilder();
        var gate = new Lock();
        process.OutputDataReceived += (_, e) =>
        {
            lock (gate)
            {
                output.AppendLine(e.Data);
            }
        };
        process.ErrorDataReceived += (_, _) => { };
        process.Start();
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
        using var limit = new CancellationTokenSource(TimeSpan.FromSeconds(60));
        if (killAfter is { } delay)
        {
            try
            {
                // Start the random delay once this process has written to the database (recovery or the first
                // batch's journal), so the kill lands in the shift whatever the start-up time under load.
                while (!WroteSince(results, writtenBefore) && !process.HasExited && !limit.IsCancellationRequested)
                {
                    await Task.Delay(10);
                }

                await process.WaitForExitAsync(new CancellationTokenSource(delay).Token);
            }
            catch (OperationCanceledException)
            {
                process.Kill(entireProcessTree: true);
            }
        }

        await process.WaitForExitAsync(limit.Token);
        lock (gate)
        {
            return (output.ToString(), process.ExitCode);
        }
    }

    private static DateTime LastWrite(string results)
    {
        var wal = ResultsDatabase.PathIn(results) + "-wal";
        return File.Exists(wal) ? File.GetLastWriteTimeUtc(wal) : DateTime.MinValue;
    }

    private static bool WroteSince(string results, DateTime before) => LastWrite(results) > before;

    private static object? Scalar(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return command.ExecuteScalar();
    }

    private static List<string> Column(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        using var reader = command.ExecuteReader();
        var values = new List<string>();
        while (reader.Read())
        {
            values.Add(reader.GetString(0));
        }

        return values;
    }
}
