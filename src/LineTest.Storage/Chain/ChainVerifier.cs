using System.Globalization;
using System.Text.Json;
using LineTest.Core.Results;
using LineTest.Storage.Json;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Chain;

/// <summary>
/// Walks the runs of a results database in insertion order and checks that each one still is what was
/// written: its record hash recomputed from <c>run_json</c> and the previous hash, its link to the run
/// before it, its columns and its readings rows against <c>run_json</c>. Reports the first problem.
/// </summary>
/// <remarks>
/// A plain hash chain cannot tell a legitimately last run from a forged run appended with a correctly
/// computed hash, nor notice runs removed from the very end; <see cref="ChainReport.HeadSha256"/> recorded
/// elsewhere closes that gap.
/// </remarks>
public static class ChainVerifier
{
    private static readonly string RunSelect =
        $"SELECT seq, prev_sha256, record_sha256, run_json, {string.Join(", ", RunColumns.Names)} FROM runs ORDER BY seq;";

    private static readonly string ReadingSelect =
        $"SELECT run_seq, run_id, {string.Join(", ", ReadingColumns.Names)} FROM readings ORDER BY run_seq, ordinal;";

    /// <summary>Checks the database file at <paramref name="databasePath"/>.</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read at all.</exception>
    public static async Task<ChainReport> VerifyAsync(string databasePath, CancellationToken ct = default)
    {
        var reader = new SqliteResultReader(databasePath);
        await using var connection = await reader.OpenAsync(ct).ConfigureAwait(false);
        try
        {
            return Verify(connection, ct);
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The hash chain could not be checked", reader.DatabasePath);
        }
    }

    private static ChainReport Verify(SqliteConnection connection, CancellationToken ct)
    {
        using var runCommand = connection.CreateCommand();
        runCommand.CommandText = RunSelect;
        using var readingCommand = connection.CreateCommand();
        readingCommand.CommandText = ReadingSelect;
        using var runs = runCommand.ExecuteReader();
        using var readings = readingCommand.ExecuteReader();
        var readingCursor = new ReadingCursor(readings);

        var expectedPrevious = RecordHash.Genesis;
        StoredRun? previous = null;
        long checkedRuns = 0;
        var found = new Found();
        var current = StoredRun.ReadNext(runs);
        while (current is not null)
        {
            ct.ThrowIfCancellationRequested();
            var next = StoredRun.ReadNext(runs);

            // Readings left behind by deleted runs: report them and move past, then check where this run stands.
            var position = CheckPosition(previous, current, next, expectedPrevious, readingCursor);
            while (position is not null && position.RunId is null && readingCursor.HasRow && readingCursor.RunSeq < current.Seq)
            {
                found.Add(position, checkedRuns, expectedPrevious, previous);
                SkipReadings(readingCursor, readingCursor.RunSeq);
                position = CheckPosition(previous, current, next, expectedPrevious, readingCursor);
            }

            var inserted = false;
            if (position is not null)
            {
                found.Add(position, checkedRuns, expectedPrevious, previous);
                inserted = position.Kind == ChainProblemKind.RunInserted && position.Seq == current.Seq;
            }

            if (CheckContent(current, readingCursor) is { } content)
            {
                found.Add(content, checkedRuns, expectedPrevious, previous);
                SkipReadings(readingCursor, current.Seq);
            }

            if (!inserted)
            {
                // Carry on from this run, so every later problem is found too, not only the first.
                expectedPrevious = current.Record;
                previous = current;
            }

            if (found.Count == 0)
            {
                checkedRuns++;
            }

            current = next;
        }

        while (readingCursor.HasRow)
        {
            found.Add(
                new ChainProblem(
                    ChainProblemKind.RunMissing,
                    readingCursor.RunSeq,
                    null,
                    $"Readings are stored for a run with seq {readingCursor.RunSeq}, but that run is not in the runs table: it was deleted."),
                checkedRuns,
                expectedPrevious,
                previous);
            SkipReadings(readingCursor, readingCursor.RunSeq);
        }

        return found.Count == 0
            ? new ChainReport(checkedRuns, expectedPrevious, null)
            : new ChainReport(found.IntactRuns, found.IntactHead, found.List[0]) { Problems = found.List, ProblemCount = found.Count };
    }

    private static void SkipReadings(ReadingCursor readings, long seq)
    {
        while (readings.HasRow && readings.RunSeq == seq)
        {
            readings.Advance();
        }
    }

    private static ChainProblem? CheckPosition(StoredRun? previous, StoredRun current, StoredRun? next, string expectedPrevious, ReadingCursor readings)
    {
        if (readings.HasRow && readings.RunSeq < current.Seq)
        {
            return new ChainProblem(
                ChainProblemKind.RunMissing,
                readings.RunSeq,
                null,
                $"Readings are stored for a run with seq {readings.RunSeq}, but that run is not in the runs table: it was deleted.");
        }

        var expectedSeq = previous is null ? 1 : previous.Seq + 1;
        if (current.Seq > expectedSeq)
        {
            var range = current.Seq - 1 == expectedSeq ? $"seq {expectedSeq} is" : $"seq {expectedSeq} to {current.Seq - 1} are";
            return new ChainProblem(
                ChainProblemKind.RunMissing,
                current.Seq,
                current.Id,
                $"The run(s) with {range} missing before run {Describe(current)}: they were deleted.");
        }

        if (current.Previous == expectedPrevious)
        {
            return null;
        }

        if (next is not null && next.Previous == expectedPrevious)
        {
            return new ChainProblem(
                ChainProblemKind.RunInserted,
                current.Seq,
                current.Id,
                $"Run {Describe(current)} does not belong to the chain: the run after it follows directly on the run before it, so it was inserted.");
        }

        if (previous is not null && current.Previous == previous.Previous)
        {
            return new ChainProblem(
                ChainProblemKind.RunInserted,
                previous.Seq,
                previous.Id,
                $"Runs {Describe(previous)} and {Describe(current)} both claim the same predecessor, so run {Describe(previous)} was inserted.");
        }

        return new ChainProblem(
            ChainProblemKind.RunMissing,
            current.Seq,
            current.Id,
            $"Run {Describe(current)} does not follow on the run before it: a run before it was deleted, or its prev_sha256 was edited.");
    }

    private static ChainProblem? CheckContent(StoredRun current, ReadingCursor readings)
    {
        if (RecordHash.Compute(current.Json, current.Previous) != current.Record)
        {
            return Changed(current, "its run_json or record_sha256 was edited (the record hash does not match)");
        }

        RunRecord run;
        try
        {
            run = RunJson.Deserialize(current.Json);
        }
        catch (JsonException ex)
        {
            return Changed(current, $"its run_json is not a valid run ({ex.Message})");
        }

        var expected = RunColumns.Values(run);
        for (var i = 0; i < expected.Length; i++)
        {
            if (!Equals(expected[i], current.Columns[i]))
            {
                return Changed(current, $"column {RunColumns.Names[i]} holds {Show(current.Columns[i])} but the stored run says {Show(expected[i])}");
            }
        }

        var ordinal = 0;
        var id = run.Id.ToString("D");
        for (; readings.HasRow && readings.RunSeq == current.Seq; ordinal++)
        {
            if (ordinal >= run.Readings.Count)
            {
                return ReadingsChanged(current, $"the readings table has more rows for it than the {run.Readings.Count} readings in its run_json");
            }

            if (!Equals(id, readings.RunId))
            {
                return ReadingsChanged(current, $"reading {ordinal} has run_id {Show(readings.RunId)}");
            }

            var expectedReading = ReadingColumns.Values(run.Readings[ordinal], ordinal);
            for (var i = 0; i < expectedReading.Length; i++)
            {
                if (!Equals(expectedReading[i], readings.Columns[i]))
                {
                    return ReadingsChanged(
                        current,
                        $"reading {ordinal} ({run.Readings[ordinal].Name}) column {ReadingColumns.Names[i]} holds {Show(readings.Columns[i])} but the stored run says {Show(expectedReading[i])}");
                }
            }

            readings.Advance();
        }

        return ordinal < run.Readings.Count
            ? ReadingsChanged(current, $"the readings table has {ordinal} rows for it but its run_json has {run.Readings.Count} readings")
            : null;
    }

    private static ChainProblem Changed(StoredRun run, string why) =>
        new(ChainProblemKind.RunChanged, run.Seq, run.Id, $"Run {Describe(run)} was changed after it was stored: {why}.");

    private static ChainProblem ReadingsChanged(StoredRun run, string why) =>
        new(ChainProblemKind.ReadingsChanged, run.Seq, run.Id, $"The readings of run {Describe(run)} were changed after they were stored: {why}.");

    private static string Describe(StoredRun run) => $"seq {run.Seq} (id {run.IdText})";

    private static string Show(object? value) => value switch
    {
        null => "nothing",
        double d => d.ToString("R", CultureInfo.InvariantCulture),
        IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
        _ => $"'{value}'",
    };

    /// <summary>The problems found so far (the first <see cref="ChainReport.ProblemListLimit"/> kept) and the intact prefix.</summary>
    private sealed class Found
    {
        public List<ChainProblem> List { get; } = [];

        public long Count { get; private set; }

        public long IntactRuns { get; private set; }

        public string IntactHead { get; private set; } = RecordHash.Genesis;

        public void Add(ChainProblem problem, long checkedRuns, string expectedPrevious, StoredRun? previous)
        {
            if (Count == 0)
            {
                // An inserted run found one step late was accepted already; do not count it as intact.
                var late = problem.Kind == ChainProblemKind.RunInserted && previous is not null && problem.Seq == previous.Seq;
                IntactRuns = late ? checkedRuns - 1 : checkedRuns;
                IntactHead = late ? previous!.Previous : expectedPrevious;
            }

            Count++;
            if (List.Count < ChainReport.ProblemListLimit)
            {
                List.Add(problem);
            }
        }
    }

    /// <summary>One row of the runs table as read for checking.</summary>
    private sealed class StoredRun
    {
        public required long Seq { get; init; }

        public required string Previous { get; init; }

        public required string Record { get; init; }

        public required string Json { get; init; }

        public required object?[] Columns { get; init; }

        public string IdText => Columns[0] as string ?? "?";

        public Guid? Id => Guid.TryParse(IdText, out var id) ? id : null;

        public static StoredRun? ReadNext(SqliteDataReader reader)
        {
            if (!reader.Read())
            {
                return null;
            }

            var columns = new object?[RunColumns.Names.Length];
            for (var i = 0; i < columns.Length; i++)
            {
                columns[i] = Value(reader, 4 + i);
            }

            return new StoredRun
            {
                Seq = reader.GetInt64(0),
                Previous = Value(reader, 1) as string ?? string.Empty,
                Record = Value(reader, 2) as string ?? string.Empty,
                Json = Value(reader, 3) as string ?? string.Empty,
                Columns = columns,
            };
        }
    }

    /// <summary>The readings table read in step with the runs (both ordered by seq).</summary>
    private sealed class ReadingCursor
    {
        private readonly SqliteDataReader _reader;

        public ReadingCursor(SqliteDataReader reader)
        {
            _reader = reader;
            Columns = new object?[ReadingColumns.Names.Length];
            Advance();
        }

        public bool HasRow { get; private set; }

        public long RunSeq { get; private set; }

        public object? RunId { get; private set; }

        public object?[] Columns { get; }

        public void Advance()
        {
            HasRow = _reader.Read();
            if (!HasRow)
            {
                return;
            }

            RunSeq = _reader.GetInt64(0);
            RunId = Value(_reader, 1);
            for (var i = 0; i < Columns.Length; i++)
            {
                Columns[i] = Value(_reader, 2 + i);
            }
        }
    }

    private static object? Value(SqliteDataReader reader, int ordinal)
    {
        var value = reader.GetValue(ordinal);
        return value is DBNull ? null : value;
    }
}
