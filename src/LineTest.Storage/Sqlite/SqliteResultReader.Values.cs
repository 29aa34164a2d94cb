using System.Runtime.CompilerServices;
using System.Text;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;
using SQLitePCL;

namespace LineTest.Storage.Sqlite;

/// <summary>The narrow reading scan for reports.</summary>
public sealed partial class SqliteResultReader
{
    /// <summary>
    /// Streams the readings of the runs that match <paramref name="filter"/> with only what reports use (run seq, name,
    /// value, unit, limits), in run (<c>seq</c>) order and reading order within a run. Names and units are shared
    /// string instances. Several times cheaper than <see cref="ReadReadingsAsync"/> on a large database: six columns
    /// instead of twenty-two, and the readings cursor is read through SQLite's own column functions.
    /// </summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read, or a reading is damaged.</exception>
    public IAsyncEnumerable<ReadingValue> ReadReadingValuesAsync(RunFilter? filter = null, CancellationToken ct = default) =>
        ReadReadingValuesAsync(filter, damaged: null, ct);

    /// <summary>
    /// As <see cref="ReadReadingValuesAsync(RunFilter?, CancellationToken)"/>; with <paramref name="damaged"/>, a damaged
    /// reading (an empty name, a value that is text or not finite, a low limit not below the high one) is left out and
    /// its run recorded there as damaged, instead of stopping the scan.
    /// </summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read, or a reading is damaged and no collector is given.</exception>
    public async IAsyncEnumerable<ReadingValue> ReadReadingValuesAsync(RunFilter? filter, DamagedRuns? damaged, [EnumeratorCancellation] CancellationToken ct = default)
    {
        filter ??= RunFilter.All;
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);

        // The matching runs' seqs come from the covering summary index (a few bytes per run); readings are merged
        // against them as ReadingJoin does, so a run filter is exact, not only a seq range.
        await using var runs = connection.CreateCommand();
        var runSql = new StringBuilder("SELECT r.seq FROM runs r INDEXED BY ix_runs_summary");
        FilterSql.AppendWhere(runSql, runs, filter, includeReadingNames: false);
        runs.CommandText = runSql.Append(" ORDER BY r.seq;").ToString();
        await using var runReader = await ExecuteAsync(runs, ct).ConfigureAwait(false);
        if (!Read(runReader))
        {
            yield break;
        }

        var runSeq = runReader.GetInt64(0);
        using var scan = PrepareReadingScan(connection, filter);
        var names = new Utf8StringPool();
        var units = new Utf8StringPool();
        var count = 0;
        while (Step(connection, scan))
        {
            if ((++count & 0xFFFF) == 0)
            {
                ct.ThrowIfCancellationRequested();
            }

            var readingRunSeq = raw.sqlite3_column_int64(scan, 0);
            while (runSeq < readingRunSeq)
            {
                if (!Read(runReader))
                {
                    yield break;
                }

                runSeq = runReader.GetInt64(0);
            }

            if (runSeq != readingRunSeq)
            {
                continue;
            }

            var (value, damage) = ReadValue(scan, readingRunSeq, names, units);
            if (damage is null)
            {
                yield return value;
            }
            else if (damaged is not null)
            {
                damaged.Add(readingRunSeq, damage);
            }
            else
            {
                throw Damaged(readingRunSeq, damage);
            }
        }
    }

    /// <summary>A damaged row: the database is not usable for a report as it is; says which run and why.</summary>
    internal ResultStoreException Damaged(long seq, string reason) => new(
        ResultStoreFailure.Incompatible,
        $"The results database '{DatabasePath}' holds a damaged run (seq {seq}): {reason}. Restore it from a backup or report on a filtered range.");

    /// <summary>One reading, or why it is damaged.</summary>
    private static (ReadingValue Value, string? Damage) ReadValue(sqlite3_stmt scan, long seq, Utf8StringPool names, Utf8StringPool units)
    {
        var name = names.Get(raw.sqlite3_column_blob(scan, 1));
        if (string.IsNullOrWhiteSpace(name))
        {
            return (default, "a reading has an empty name");
        }

        var valueDamage = Number(scan, 2, name, "value", out var value);
        var lowDamage = Number(scan, 4, name, "low limit", out var low);
        var highDamage = Number(scan, 5, name, "high limit", out var high);
        var damage = valueDamage ?? lowDamage ?? highDamage;
        if (damage is null && low is { } l && high is { } h && !(l < h))
        {
            damage = FormattableString.Invariant($"reading '{name}' has a low limit {l} that is not below its high limit {h}");
        }

        return damage is null ? (new ReadingValue(seq, name, value, units.Get(raw.sqlite3_column_blob(scan, 3)), low, high), null) : (default, damage);
    }

    /// <summary>A numeric column: null, or a finite number; text, a blob or an infinity is damage (its reason), never 0.</summary>
    private static string? Number(sqlite3_stmt statement, int column, string name, string what, out double? number)
    {
        number = null;
        var type = raw.sqlite3_column_type(statement, column);
        if (type == raw.SQLITE_NULL)
        {
            return null;
        }

        if (type is raw.SQLITE_FLOAT or raw.SQLITE_INTEGER)
        {
            var read = raw.sqlite3_column_double(statement, column);
            number = read;
            return double.IsFinite(read) ? null : FormattableString.Invariant($"reading '{name}' has a {what} of {read}, which is not a finite number");
        }

        var text = type == raw.SQLITE_TEXT ? raw.sqlite3_column_text(statement, column).utf8_to_string() : "(binary data)";
        return $"reading '{name}' has a {what} of '{Shorten(text)}', which is not a number";
    }

    private static string Shorten(string text) => text.Length <= 40 ? text : text[..40] + "…";

    /// <summary>
    /// The lowest and highest <c>seq</c> of the runs that match <paramref name="filter"/> now (null when none do). Runs
    /// are only ever appended, so a later scan bounded by this range sees exactly these runs and their readings,
    /// whatever the station writes meanwhile.
    /// </summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async Task<SeqRange?> ReadSeqRangeAsync(RunFilter? filter = null, CancellationToken ct = default)
    {
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        return SeqRangeOf(connection, filter ?? RunFilter.All) is var (low, high) ? new SeqRange(low, high) : null;
    }

    /// <summary><see cref="FilterSql.SeqRange"/> with SQLite's errors (a damaged page met on the way) as damaged-database errors.</summary>
    private (long Low, long High)? SeqRangeOf(SqliteConnection connection, RunFilter filter)
    {
        try
        {
            return FilterSql.SeqRange(connection, filter);
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }
    }

    private sqlite3_stmt PrepareReadingScan(SqliteConnection connection, RunFilter filter)
    {
        var conditions = new List<string>();
        if (filter.HasRunCondition)
        {
            conditions.Add("g.run_seq BETWEEN ?1 AND ?2");
        }

        var names = filter.ReadingNames is { Count: > 0 } given ? given.ToList() : [];
        if (names.Count > 0)
        {
            // The unary + keeps the planner off ix_readings_name, which would need a sort to restore run order.
            conditions.Add($"+g.name IN ({string.Join(", ", names.Select((_, i) => $"?{i + 3}"))})");
        }

        var sql = new StringBuilder("SELECT g.run_seq, g.name, g.value, g.unit, g.low, g.high FROM readings g");
        if (conditions.Count > 0)
        {
            sql.Append(" WHERE ").AppendJoin(" AND ", conditions);
        }

        sql.Append(" ORDER BY g.run_seq, g.ordinal;");
        var db = connection.Handle!;
        Check(db, raw.sqlite3_prepare_v2(db, sql.ToString(), out var statement));
        try
        {
            if (conditions.Count > 0 && conditions[0].StartsWith("g.run_seq", StringComparison.Ordinal))
            {
                var (low, high) = SeqRangeOf(connection, filter) ?? (0, -1);
                Check(db, raw.sqlite3_bind_int64(statement, 1, low));
                Check(db, raw.sqlite3_bind_int64(statement, 2, high));
            }

            for (var i = 0; i < names.Count; i++)
            {
                Check(db, raw.sqlite3_bind_text(statement, i + 3, names[i]));
            }

            return statement;
        }
        catch
        {
            statement.Dispose();
            throw;
        }
    }

    private bool Step(SqliteConnection connection, sqlite3_stmt statement)
    {
        var rc = raw.sqlite3_step(statement);
        if (rc == raw.SQLITE_ROW)
        {
            return true;
        }

        if (rc == raw.SQLITE_DONE)
        {
            return false;
        }

        Check(connection.Handle!, rc);
        return false;
    }

    private void Check(sqlite3 db, int rc)
    {
        if (rc != raw.SQLITE_OK)
        {
            var message = raw.sqlite3_errmsg(db).utf8_to_string();
            throw SqliteFailures.Map(new SqliteException($"SQLite Error {rc}: '{message}'.", rc), "The results could not be read", DatabasePath);
        }
    }

    private static double? NullableDouble(sqlite3_stmt statement, int column) =>
        raw.sqlite3_column_type(statement, column) == raw.SQLITE_NULL ? null : raw.sqlite3_column_double(statement, column);
}
