using System.Runtime.CompilerServices;
using System.Text;
using System.Text.Json;
using LineTest.Core.Results;
using LineTest.Storage.Json;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// Reads a results database for reports. Opens its own read-only connection per call, so it can run beside
/// a station that is writing. Summary and reading streams read indexed columns only: no JSON is parsed.
/// </summary>
public sealed partial class SqliteResultReader
{
    private const string RunColumnsSql =
        "r.seq, r.id, r.serial, r.verdict, r.ended_utc, r.station, r.slot, r.lot, r.sequence_id, r.sequence_revision";

    /// <summary>Creates a reader of the database file at <paramref name="databasePath"/>.</summary>
    public SqliteResultReader(string databasePath)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(databasePath);
        DatabasePath = Path.GetFullPath(databasePath);
    }

    /// <summary>The database file.</summary>
    public string DatabasePath { get; }

    /// <summary>A reader of <c>results.db</c> in <paramref name="resultsDirectory"/>.</summary>
    public static SqliteResultReader InDirectory(string resultsDirectory) => new(ResultsDatabase.PathIn(resultsDirectory));

    /// <summary>Streams run summaries in insertion (<c>seq</c>) order.</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async IAsyncEnumerable<RunSummary> ReadRunsAsync(RunFilter? filter = null, [EnumeratorCancellation] CancellationToken ct = default)
    {
        filter ??= RunFilter.All;
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        var sql = new StringBuilder($"SELECT {RunColumnsSql}, r.reason, r.first_failing_reading FROM runs r");
        FilterSql.AppendWhere(sql, command, filter, includeReadingNames: false);
        sql.Append(" ORDER BY r.seq;");
        command.CommandText = sql.ToString();
        await using var reader = await ExecuteAsync(command, ct).ConfigureAwait(false);
        while (Read(reader))
        {
            ct.ThrowIfCancellationRequested();
            yield return Checked(reader.GetInt64(0), () => new RunSummary(
                reader.GetInt64(0),
                ParseGuid(reader, 1),
                reader.GetString(2),
                ParseVerdict(reader, 3),
                ParseUtc(reader, 4),
                reader.GetString(5),
                reader.GetInt32(6),
                NullableString(reader, 7),
                reader.GetString(8),
                reader.GetInt32(9),
                NullableString(reader, 10),
                NullableString(reader, 11)));
        }
    }

    /// <summary>Reads one row of run <paramref name="seq"/>; a value that does not parse is reported as damage to that run.</summary>
    private T Checked<T>(long seq, Func<T> read)
    {
        try
        {
            return read();
        }
        catch (Exception ex) when (ex is FormatException or InvalidDataException or OverflowException or InvalidCastException or ArgumentException)
        {
            throw Damaged(seq, ex.Message);
        }
    }

    /// <summary>Streams readings with their run's columns, in run (<c>seq</c>) order and reading order within a run.</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async IAsyncEnumerable<ReadingRow> ReadReadingsAsync(RunFilter? filter = null, [EnumeratorCancellation] CancellationToken ct = default)
    {
        filter ??= RunFilter.All;
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        ReadingJoin join;
        try
        {
            join = new ReadingJoin(
                connection,
                filter,
                RunColumnsSql,
                "g.ordinal, g.name, g.value, g.unit, g.low, g.high, g.verdict, g.step, g.setpoint, g.uncertainty, g.acceptance_low, g.acceptance_high");
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }

        using var joined = join;
        var runs = joined.Runs;
        var reader = joined.Readings;

        // Runs arrive grouped, so the run's own strings are read once per run, not once per reading.
        Guid runId = default;
        string serial = string.Empty, station = string.Empty, sequenceId = string.Empty;
        string? lot = null;
        var runVerdict = Verdict.Error;
        DateTimeOffset ended = default;
        int slot = 0, revision = 0;
        long seq = 0;
        while (Next(joined))
        {
            ct.ThrowIfCancellationRequested();
            if (joined.RunChanged)
            {
                seq = Checked(0, () => runs.GetInt64(0));
                runId = Checked(seq, () => ParseGuid(runs, 1));
                serial = Checked(seq, () => runs.GetString(2));
                runVerdict = Checked(seq, () => ParseVerdict(runs, 3));
                ended = Checked(seq, () => ParseUtc(runs, 4));
                station = runs.GetString(5);
                slot = runs.GetInt32(6);
                lot = NullableString(runs, 7);
                sequenceId = runs.GetString(8);
                revision = runs.GetInt32(9);
            }

            yield return Checked(seq, () => new ReadingRow(
                seq,
                runId,
                serial,
                runVerdict,
                ended,
                station,
                slot,
                lot,
                sequenceId,
                revision,
                reader.GetInt32(1),
                reader.GetString(2),
                NullableDouble(reader, 3),
                reader.GetString(4),
                NullableDouble(reader, 5),
                NullableDouble(reader, 6),
                ParseVerdict(reader, 7),
                NullableString(reader, 8),
                NullableString(reader, 9),
                NullableDouble(reader, 10),
                NullableDouble(reader, 11),
                NullableDouble(reader, 12)));
        }
    }

    /// <summary>Counts the runs that match <paramref name="filter"/>.</summary>
    public async Task<long> CountRunsAsync(RunFilter? filter = null, CancellationToken ct = default)
    {
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        var sql = new StringBuilder("SELECT count(*) FROM runs r");
        FilterSql.AppendWhere(sql, command, filter ?? RunFilter.All, includeReadingNames: false);
        command.CommandText = sql.ToString();
        try
        {
            return (long)(await command.ExecuteScalarAsync(ct).ConfigureAwait(false))!;
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }
    }

    /// <summary>Loads one whole run from its stored JSON, or null when no run has that id.</summary>
    /// <exception cref="ResultStoreException">The database cannot be read, or the stored run is not valid.</exception>
    public async Task<RunRecord?> LoadRunAsync(Guid id, CancellationToken ct = default)
    {
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT run_json FROM runs WHERE id = $id;";
        command.Parameters.AddWithValue("$id", id.ToString("D"));
        string? json;
        try
        {
            json = await command.ExecuteScalarAsync(ct).ConfigureAwait(false) as string;
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, $"Run {id:D} could not be read", DatabasePath);
        }

        if (json is null)
        {
            return null;
        }

        try
        {
            return RunJson.Deserialize(json);
        }
        catch (JsonException ex)
        {
            throw new ResultStoreException(
                ResultStoreFailure.Incompatible, $"Run {id:D} in '{DatabasePath}' is not a valid stored run: {ex.Message}", ex);
        }
    }

    internal async Task<SqliteConnection> OpenAsync(CancellationToken ct)
    {
        const string what = "The results database cannot be read";
        if (!File.Exists(DatabasePath))
        {
            throw new ResultStoreException(
                ResultStoreFailure.CannotOpen, $"{what}: '{DatabasePath}' does not exist. Check the results folder in the station settings.");
        }

        var connection = new SqliteConnection(ResultsDatabase.ConnectionString(DatabasePath, SqliteOpenMode.ReadOnly));
        try
        {
            await connection.OpenAsync(ct).ConfigureAwait(false);
            var problem = SqliteSchema.Check(connection, emptyAllowed: false);
            if (problem is not null)
            {
                throw new ResultStoreException(ResultStoreFailure.Incompatible, $"{what}: '{DatabasePath}' cannot be used because {problem}.");
            }

            return connection;
        }
        catch (Exception ex) when (ex is SqliteException or ResultStoreException)
        {
            await connection.DisposeAsync().ConfigureAwait(false);
            throw SqliteFailures.Map(ex, what, DatabasePath);
        }
    }

    private async Task<SqliteDataReader> ExecuteAsync(SqliteCommand command, CancellationToken ct)
    {
        try
        {
            return await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }
    }

    private bool Next(ReadingJoin join)
    {
        try
        {
            return join.MoveNext();
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }
    }

    private bool Read(SqliteDataReader reader)
    {
        try
        {
            return reader.Read();
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }
    }

    private static Guid ParseGuid(SqliteDataReader reader, int ordinal) => Guid.ParseExact(reader.GetString(ordinal), "D");

    private static DateTimeOffset ParseUtc(SqliteDataReader reader, int ordinal) => UtcText.Parse(reader.GetString(ordinal));

    private static Verdict ParseVerdict(SqliteDataReader reader, int ordinal)
    {
        // Exact words only: the schema's CHECK constraint allows nothing else, and this path runs per row.
        var word = reader.GetString(ordinal);
        return word switch
        {
            "pass" => Verdict.Pass,
            "fail" => Verdict.Fail,
            "error" => Verdict.Error,
            _ => throw new InvalidDataException($"Column {reader.GetName(ordinal)} holds '{word}', which is not pass, fail or error."),
        };
    }

    private static string? NullableString(SqliteDataReader reader, int ordinal) => reader.IsDBNull(ordinal) ? null : reader.GetString(ordinal);

    private static double? NullableDouble(SqliteDataReader reader, int ordinal) => reader.IsDBNull(ordinal) ? null : reader.GetDouble(ordinal);
}
