using LineTest.Storage.Chain;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Tests.Chain;

public sealed class ChainVerifierTests
{
    [Fact]
    public async Task VerifyAsync_UntouchedDatabase_IsIntactWithHeadOfLastRun()
    {
        var directory = await StoreRuns(4);

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        Assert.True(report.IsIntact, report.FirstProblem?.Message);
        Assert.Equal(4, report.RunsChecked);
        Assert.Equal(Execute(directory, "SELECT record_sha256 FROM runs WHERE seq = 4;"), report.HeadSha256);
    }

    [Fact]
    public async Task VerifyAsync_EmptyDatabase_IsIntactAtGenesis()
    {
        var directory = await StoreRuns(0);

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        Assert.True(report.IsIntact);
        Assert.Equal(0, report.RunsChecked);
        Assert.Equal(RecordHash.Genesis, report.HeadSha256);
    }

    [Fact]
    public async Task VerifyAsync_EditedRunJson_ReportsThatRunChanged()
    {
        var directory = await StoreRuns(4);
        var edited = Execute(directory, "UPDATE runs SET run_json = replace(run_json, '\"verdict\":\"pass\"', '\"verdict\":\"fail\"') WHERE seq = 3 RETURNING id;");

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunChanged, 3);
        Assert.Equal(Guid.Parse((string)edited!), report.FirstProblem!.RunId);
        Assert.Contains("record hash", report.FirstProblem.Message, StringComparison.Ordinal);
        Assert.Equal(2, report.RunsChecked);
    }

    [Fact]
    public async Task VerifyAsync_EditedRunJsonWithRecomputedHashes_ReportsTheColumnThatDisagrees()
    {
        // A careful forger rewrites run_json and every later hash, but the runs row's verdict column still says pass.
        var directory = await StoreRuns(3);
        Execute(directory, "UPDATE runs SET run_json = replace(run_json, '\"verdict\":\"pass\"', '\"verdict\":\"fail\"') WHERE seq = 2;");
        Rechain(directory);

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunChanged, 2);
        Assert.Contains("column verdict", report.FirstProblem!.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task VerifyAsync_EditedRunsColumn_ReportsThatRunChanged()
    {
        var directory = await StoreRuns(3);
        Execute(directory, "UPDATE runs SET serial = 'CTP40-FAKE' WHERE seq = 1;");

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunChanged, 1);
        Assert.Contains("CTP40-FAKE", report.FirstProblem!.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task VerifyAsync_EditedReadingValue_ReportsReadingsChanged()
    {
        var directory = await StoreRuns(4);
        Execute(directory, "UPDATE readings SET value = value + 0.001 WHERE run_seq = 2 AND name = 'verify.error';");

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.ReadingsChanged, 2);
        Assert.Contains("verify.error", report.FirstProblem!.Message, StringComparison.Ordinal);
        Assert.Contains("column value", report.FirstProblem.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task VerifyAsync_DeletedReadingRow_ReportsReadingsChanged()
    {
        var directory = await StoreRuns(3);
        Execute(directory, "DELETE FROM readings WHERE run_seq = 3 AND ordinal = 4;");

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.ReadingsChanged, 3);
    }

    [Fact]
    public async Task VerifyAsync_DeletedRunWithItsReadings_ReportsRunMissing()
    {
        var directory = await StoreRuns(5);
        Execute(directory, "DELETE FROM readings WHERE run_seq = 3; DELETE FROM runs WHERE seq = 3;");

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunMissing, 4);
        Assert.Contains("seq 3", report.FirstProblem!.Message, StringComparison.Ordinal);
        Assert.Equal(2, report.RunsChecked);
    }

    [Fact]
    public async Task VerifyAsync_DeletedRunLeavingItsReadings_ReportsRunMissing()
    {
        var directory = await StoreRuns(4);
        Execute(directory, "DELETE FROM runs WHERE seq = 2;", foreignKeys: false);

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunMissing, 2);
    }

    [Fact]
    public async Task VerifyAsync_DeletedRunAndRenumbered_ReportsRunMissing()
    {
        // Without a gap in seq, the broken link alone shows the deletion.
        var directory = await StoreRuns(4);
        Execute(directory, "DELETE FROM readings WHERE run_seq = 2; DELETE FROM runs WHERE seq = 2; UPDATE readings SET run_seq = run_seq - 1 WHERE run_seq > 2; UPDATE runs SET seq = seq - 1 WHERE seq > 2;", foreignKeys: false);

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunMissing, 2);
    }

    [Fact]
    public async Task VerifyAsync_ForgedRunInsertedFirstWithGenesisLink_ReportsRunInserted()
    {
        var directory = await StoreRuns(3);
        InsertCopy(directory, sourceSeq: 2, newSeq: 0, previous: RecordHash.Genesis);

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunInserted, 0);
        Assert.Equal(0, report.RunsChecked);
        Assert.Equal(RecordHash.Genesis, report.HeadSha256);
    }

    [Fact]
    public async Task VerifyAsync_ForgedRunInsertedInTheMiddleWithWrongLink_ReportsRunInserted()
    {
        var directory = await StoreRuns(4);
        // Make room after seq 2 the way a forger would, then put a copy of run 1 there.
        Execute(directory, "UPDATE readings SET run_seq = run_seq + 100 WHERE run_seq > 2; UPDATE runs SET seq = seq + 100 WHERE seq > 2; UPDATE readings SET run_seq = run_seq - 99 WHERE run_seq > 100; UPDATE runs SET seq = seq - 99 WHERE seq > 100;", foreignKeys: false);
        InsertCopy(directory, sourceSeq: 1, newSeq: 3, previous: new string('f', 64));

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        AssertProblem(report, ChainProblemKind.RunInserted, 3);
        Assert.Equal(2, report.RunsChecked);
    }

    [Fact]
    public async Task VerifyAsync_ForgedRunAppendedWithWrongLink_ReportsABrokenChainAtIt()
    {
        var directory = await StoreRuns(3);
        InsertCopy(directory, sourceSeq: 1, newSeq: 4, previous: RecordHash.Genesis);

        var report = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));

        Assert.False(report.IsIntact);
        Assert.Equal(4, report.FirstProblem!.Seq);
        Assert.Equal(3, report.RunsChecked);
    }

    private static void AssertProblem(ChainReport report, ChainProblemKind kind, long seq)
    {
        Assert.False(report.IsIntact);
        Assert.True(kind == report.FirstProblem!.Kind, $"expected {kind} but got {report.FirstProblem.Kind}: {report.FirstProblem.Message}");
        Assert.Equal(seq, report.FirstProblem.Seq);
    }

    private static async Task<string> StoreRuns(int count)
    {
        var directory = Some.TempDirectory();
        await using var store = SqliteResultStore.Open(directory);
        for (var i = 0; i < count; i++)
        {
            await store.AppendAsync(new RunRecordBuilder().WithSlot(1 + (i % 4)).Build(), CancellationToken.None);
        }

        return directory;
    }

    /// <summary>Copies a run (under a new id, with a correct record hash for the given link) to a new seq.</summary>
    private static void InsertCopy(string directory, long sourceSeq, long newSeq, string previous)
    {
        var oldId = (string)Execute(directory, $"SELECT id FROM runs WHERE seq = {sourceSeq};")!;
        var newId = Guid.NewGuid().ToString("D");
        var json = ((string)Execute(directory, $"SELECT run_json FROM runs WHERE seq = {sourceSeq};")!).Replace(oldId, newId, StringComparison.Ordinal);
        using var connection = RawDb.Open(directory, SqliteOpenMode.ReadWrite);
        using var command = connection.CreateCommand();
        command.CommandText = $"""
            INSERT INTO runs SELECT $seq, $id, serial, verdict, started_utc, ended_utc, product, sequence_id, sequence_revision,
                sequence_sha256, station, fixture, slot, lot, operator, batch_id, mode, reason, first_failing_reading,
                reading_count, $prev, $record, $json FROM runs WHERE seq = {sourceSeq};
            INSERT INTO readings SELECT $seq, ordinal, $id, name, value, unit, low, high, verdict, step, setpoint, uncertainty,
                standard_uncertainty, coverage_factor, decision_rule, acceptance_low, acceptance_high, samples, note, at_utc
                FROM readings WHERE run_seq = {sourceSeq};
            """;
        command.Parameters.AddWithValue("$seq", newSeq);
        command.Parameters.AddWithValue("$id", newId);
        command.Parameters.AddWithValue("$prev", previous);
        command.Parameters.AddWithValue("$record", RecordHash.Compute(json, previous));
        command.Parameters.AddWithValue("$json", json);
        command.ExecuteNonQuery();
    }

    /// <summary>Recomputes every record hash and link in seq order, as a forger with the tool would.</summary>
    private static void Rechain(string directory)
    {
        using var connection = RawDb.Open(directory, SqliteOpenMode.ReadWrite);
        var rows = new List<(long Seq, string Json)>();
        using (var select = connection.CreateCommand())
        {
            select.CommandText = "SELECT seq, run_json FROM runs ORDER BY seq;";
            using var reader = select.ExecuteReader();
            while (reader.Read())
            {
                rows.Add((reader.GetInt64(0), reader.GetString(1)));
            }
        }

        var previous = RecordHash.Genesis;
        foreach (var (seq, json) in rows)
        {
            var record = RecordHash.Compute(json, previous);
            using var update = connection.CreateCommand();
            update.CommandText = "UPDATE runs SET prev_sha256 = $prev, record_sha256 = $record WHERE seq = $seq;";
            update.Parameters.AddWithValue("$prev", previous);
            update.Parameters.AddWithValue("$record", record);
            update.Parameters.AddWithValue("$seq", seq);
            update.ExecuteNonQuery();
            previous = record;
        }
    }

    private static object? Execute(string directory, string sql, bool foreignKeys = true)
    {
        using var connection = RawDb.Open(directory, SqliteOpenMode.ReadWrite);
        RawDb.Scalar(connection, $"PRAGMA foreign_keys = {(foreignKeys ? "ON" : "OFF")};");
        return RawDb.Scalar(connection, sql);
    }
}
