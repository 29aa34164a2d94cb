using LineTest.Core.Results;
using LineTest.Storage.Proof;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteResultStoreRecoveryTests
{
    /// <summary>Every point of a recovery where a crash could stop it, and which occurrence (entry) to stop at.</summary>
    public static TheoryData<string, int> FaultPoints()
    {
        var data = new TheoryData<string, int>();
        foreach (var point in new[] { "recovery-read", "recovery-checked", "insert-run", "insert-readings", "delete-journal", "head-written", "committed", "recovery-removed" })
        {
            for (var occurrence = 1; occurrence <= (point == "recovery-read" || point == "recovery-removed" ? 1 : 3); occurrence++)
            {
                data.Add(point, occurrence);
            }
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(FaultPoints))]
    public async Task RecoverAsync_StoppedAtAnyPointThenStartedAgain_StoresEachEntryOnceLosesNoneAndVerifies(string point, int occurrence)
    {
        // Regression: recovery could store a run twice, or wedge the folder, when it was interrupted or found a run it had
        // already stored. Here it is stopped between two of its statements (as a kill would) and started again.
        var folder = Some.TempDirectory();
        var finished = new RunRecordBuilder().WithSerial("CTP40A-2612-000001").Build();
        var inProgress = Enumerable.Range(2, 3).Select(i => new RunRecordBuilder().WithSerial($"CTP40A-2612-00000{i}").WithSlot(i - 1).Build()).ToList();
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AppendAsync(finished, CancellationToken.None);
            await store.JournalAsync(inProgress, CancellationToken.None);
        }

        // One entry whose run is already stored (as two processes on one folder used to leave behind), proven by the head.
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.JournalAsync([finished with { Verdict = Verdict.Error }], CancellationToken.None);
        }

        Assert.Equal(3L, Count(folder, "SELECT count(*) FROM runs_in_progress;"));
        InsertJournalRowOfStoredRunThroughTheStoreSeam(folder, finished);

        var hits = 0;
        await using (var crashing = SqliteResultStore.Open(folder))
        {
            crashing.FaultPoint = p =>
            {
                if (p == point && ++hits == occurrence)
                {
                    throw new SimulatedCrashException(p);
                }
            };
            await Assert.ThrowsAsync<SimulatedCrashException>(() => crashing.RecoverAsync(CancellationToken.None));
        }

        await using (var restarted = SqliteResultStore.Open(folder))
        {
            await restarted.RecoverAsync(CancellationToken.None);
            Assert.Empty((await restarted.RecoverAsync(CancellationToken.None)).Stored);
        }

        Assert.Equal(0L, Count(folder, "SELECT count(*) FROM runs_in_progress;"));
        Assert.Equal(4L, Count(folder, "SELECT count(*) FROM runs;"));
        foreach (var run in inProgress.Append(finished))
        {
            Assert.Equal(1L, Count(folder, $"SELECT count(*) FROM runs WHERE id = '{run.Id:D}';"));
        }

        Assert.Equal(3L, Count(folder, "SELECT count(*) FROM runs WHERE reason = 'interrupted';"));
        var report = await ProofVerifier.VerifyAsync(folder);
        Assert.True(report.IsIntact, string.Join(Environment.NewLine, report.ProblemLines()));

        // Not wedged: the folder takes new runs.
        await using var again = SqliteResultStore.Open(folder);
        await again.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
    }

    [Fact]
    public async Task RecoverAsync_JournalEntryOfAStoredRun_RemovesItAndStoresNothingTwice()
    {
        // Regression: a journal entry whose run was already stored failed every later start with
        // "UNIQUE constraint failed: runs.id", so the folder could no longer be used.
        var folder = Some.TempDirectory();
        var run = new RunRecordBuilder().Build();
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AppendAsync(run, CancellationToken.None);
            await store.JournalAsync([run with { Verdict = Verdict.Error }], CancellationToken.None);
        }

        Assert.Equal(0L, Count(folder, "SELECT count(*) FROM runs_in_progress;"));
        InsertJournalRowOfStoredRunThroughTheStoreSeam(folder, run);

        await using var reopened = SqliteResultStore.Open(folder);
        var recovery = await reopened.RecoverAsync(CancellationToken.None);

        Assert.Empty(recovery.Stored);
        var removed = Assert.Single(recovery.Removed);
        Assert.Equal(run.Id.ToString("D"), removed.Id);
        Assert.Equal(1L, Count(folder, "SELECT count(*) FROM runs;"));
        await reopened.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        Assert.True((await ProofVerifier.VerifyAsync(folder)).IsIntact);
    }

    [Fact]
    public async Task RecoverAsync_UnreadableJournalEntry_StoredAsJournalUnreadableErrorKeepingItsRawText()
    {
        var folder = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        const string raw = "{\"id\": \"not a run\", truncated";
        using (var connection = RawDb.Open(folder, SqliteOpenMode.ReadWrite))
        {
            using var command = connection.CreateCommand();
            command.CommandText = "INSERT INTO runs_in_progress VALUES ('0b6d1b7e-0000-4000-8000-000000000001', 'CTP40A-2612-000009', 3, 'B1', "
                + "'2026-12-03T06:00:00.0000000Z', '2026-12-03T06:05:00.0000000Z', $raw);";
            command.Parameters.AddWithValue("$raw", raw);
            command.ExecuteNonQuery();
        }

        await using var reopened = SqliteResultStore.Open(folder);
        var run = Assert.Single((await reopened.RecoverAsync(CancellationToken.None)).Stored);

        Assert.Equal(SqliteResultStore.JournalUnreadableReason, run.Reason);
        Assert.Equal(Verdict.Error, run.Verdict);
        Assert.Equal("CTP40A-2612-000009", run.Serial);
        Assert.Equal(3, run.Slot);
        Assert.Equal(raw, run.Readings.Single(r => r.Name == SqliteResultStore.JournalRawReading).Note);
        Assert.Equal(0L, Count(folder, "SELECT count(*) FROM runs_in_progress;"));
        var stored = await new SqliteResultReader(ResultsDatabase.PathIn(folder)).LoadRunAsync(run.Id);
        Assert.Equal(raw, stored!.Readings.Single(r => r.Name == SqliteResultStore.JournalRawReading).Note);
    }

    [Fact]
    public async Task JournalAsync_RunAlreadyStored_DoesNotBringItsEntryBack()
    {
        // Regression: the first of two processes journaled runs that the second had already stored as interrupted.
        var folder = Some.TempDirectory();
        var run = new RunRecordBuilder().Build();
        await using var store = SqliteResultStore.Open(folder);
        await store.AppendAsync(run, CancellationToken.None);

        await store.JournalAsync([run], CancellationToken.None);

        Assert.Empty(await store.ReadJournalAsync(CancellationToken.None));
    }

    private static void InsertJournalRowOfStoredRunThroughTheStoreSeam(string folder, RunRecord run)
    {
        // The journal writer no longer brings a stored run back, so put the row in as the old two-process race did, and
        // prove it in the head as the station would have (the race happened inside the station, not outside it).
        using var connection = RawDb.Open(folder, SqliteOpenMode.ReadWrite);
        using var command = connection.CreateCommand();
        command.CommandText = "INSERT INTO runs_in_progress VALUES ($id, $serial, $slot, NULL, '2026-12-03T06:00:00.0000000Z', '2026-12-03T06:01:00.0000000Z', $json);";
        command.Parameters.AddWithValue("$id", run.Id.ToString("D"));
        command.Parameters.AddWithValue("$serial", run.Serial);
        command.Parameters.AddWithValue("$slot", run.Slot);
        command.Parameters.AddWithValue("$json", LineTest.Storage.Json.RunJson.Serialize(run));
        command.ExecuteNonQuery();
        var head = HeadFile.Read(folder).Head!;
        var journal = head.Current.Journal.Append(new JournalProof(run.Id.ToString("D"), ProofReader.JournalHash(LineTest.Storage.Json.RunJson.Serialize(run))))
            .OrderBy(j => j.Id, StringComparer.Ordinal).ToList();
        HeadFile.Write(folder, new ResultsHead(head.Current with { Journal = journal }, head.Current));
    }

    private static long Count(string folder, string sql)
    {
        using var connection = RawDb.Open(folder);
        return (long)RawDb.Scalar(connection, sql)!;
    }

    private sealed class SimulatedCrashException(string point) : Exception($"simulated crash at {point}");
}
