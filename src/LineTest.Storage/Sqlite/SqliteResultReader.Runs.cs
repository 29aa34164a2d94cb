using System.Buffers.Text;
using System.Runtime.CompilerServices;
using System.Text;
using LineTest.Core.Results;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;
using SQLitePCL;

namespace LineTest.Storage.Sqlite;

/// <summary>The run summary scan for reports.</summary>
public sealed partial class SqliteResultReader
{
    /// <summary>
    /// The same summaries as <see cref="ReadRunsAsync"/>, in the same order, read through SQLite's own column
    /// functions with the texts that repeat from run to run (verdict, station, lot, sequence id, reason, first failing
    /// reading) shared: several times cheaper per run on a large database, which is what a report over a million runs
    /// needs.
    /// </summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read, or a run is damaged.</exception>
    public IAsyncEnumerable<RunSummary> ReadRunsForReportAsync(RunFilter? filter = null, CancellationToken ct = default) =>
        ReadRunsForReportAsync(filter, damaged: null, ct);

    /// <summary>
    /// As <see cref="ReadRunsForReportAsync(RunFilter?, CancellationToken)"/>; with <paramref name="damaged"/>, a
    /// damaged run (no serial, a date or verdict that does not parse, …) is recorded there and left out instead of
    /// stopping the scan.
    /// </summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read, or a run is damaged and no collector is given.</exception>
    public async IAsyncEnumerable<RunSummary> ReadRunsForReportAsync(RunFilter? filter, DamagedRuns? damaged, [EnumeratorCancellation] CancellationToken ct = default)
    {
        filter ??= RunFilter.All;
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        var sql = new StringBuilder($"SELECT {RunColumnsSql}, r.reason, r.first_failing_reading FROM runs r");
        FilterSql.AppendWhere(sql, command, filter, includeReadingNames: false);
        sql.Append(" ORDER BY r.seq;");
        using var scan = Prepare(connection, sql.ToString(), command.Parameters);
        var pool = new Utf8StringPool();
        var count = 0;
        while (Step(connection, scan))
        {
            if ((++count & 0xFFFF) == 0)
            {
                ct.ThrowIfCancellationRequested();
            }

            var (run, damage) = ReadSummary(scan, pool);
            if (run is { } summary)
            {
                yield return summary;
            }
            else if (damaged is not null)
            {
                damaged.Add(raw.sqlite3_column_int64(scan, 0), damage!);
            }
            else
            {
                throw Damaged(raw.sqlite3_column_int64(scan, 0), damage!);
            }
        }
    }

    /// <summary>One run, or why it is damaged.</summary>
    private static (RunSummary? Run, string? Damage) ReadSummary(sqlite3_stmt scan, Utf8StringPool pool)
    {
        var seq = raw.sqlite3_column_int64(scan, 0);
        try
        {
            var serial = Encoding.UTF8.GetString(raw.sqlite3_column_blob(scan, 2));
            if (string.IsNullOrWhiteSpace(serial))
            {
                return (null, "the run has no serial");
            }

            var sequenceId = pool.Get(raw.sqlite3_column_blob(scan, 8));
            if (string.IsNullOrWhiteSpace(sequenceId))
            {
                return (null, "the run has no sequence id");
            }

            if (raw.sqlite3_column_type(scan, 6) != raw.SQLITE_INTEGER || raw.sqlite3_column_type(scan, 9) != raw.SQLITE_INTEGER)
            {
                return (null, "the slot or the sequence revision is not a whole number");
            }

            return (new RunSummary(
                seq,
                ParseGuid(scan, 1),
                serial,
                ParseVerdict(pool.Get(raw.sqlite3_column_blob(scan, 3))),
                ParseUtc(raw.sqlite3_column_blob(scan, 4)),
                pool.Get(raw.sqlite3_column_blob(scan, 5)),
                raw.sqlite3_column_int(scan, 6),
                PooledOrNull(pool, scan, 7),
                sequenceId,
                raw.sqlite3_column_int(scan, 9),
                PooledOrNull(pool, scan, 10),
                PooledOrNull(pool, scan, 11)), null);
        }
        catch (Exception ex) when (ex is FormatException or InvalidDataException or OverflowException or ArgumentException)
        {
            // A stored run that does not parse (a non-date ended_utc, verdict 'maybe', an id that is no GUID).
            return (null, ex.Message);
        }
    }

    /// <summary>
    /// The product of each given run (a primary-key look-up per run), keyed by the run's sequence id: reports name the
    /// product each figure covers without reading the product column of every run.
    /// </summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async Task<IReadOnlyDictionary<string, string>> ReadProductsAsync(IEnumerable<long> runSeqs, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(runSeqs);
        var products = new Dictionary<string, string>(StringComparer.Ordinal);
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT sequence_id, product FROM runs WHERE seq = $seq;";
        var parameter = command.Parameters.Add("$seq", SqliteType.Integer);
        foreach (var seq in runSeqs)
        {
            parameter.Value = seq;
            await using var reader = await ExecuteAsync(command, ct).ConfigureAwait(false);
            // A damaged product or sequence cell only costs the product's name in the report.
            if (Read(reader) && reader.GetValue(0) is string sequence && reader.GetValue(1) is string product
                && !string.IsNullOrWhiteSpace(sequence) && !string.IsNullOrWhiteSpace(product))
            {
                products[sequence] = product;
            }
        }

        return products;
    }

    /// <summary>The latest end time of any stored run (from the end-time index), or null when none is stored.</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read, or the stored time is damaged.</exception>
    public async Task<DateTimeOffset?> ReadLastEndedAsync(CancellationToken ct = default)
    {
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT seq, ended_utc FROM runs ORDER BY ended_utc DESC LIMIT 1;";
        await using var reader = await ExecuteAsync(command, ct).ConfigureAwait(false);
        if (!Read(reader))
        {
            return null;
        }

        return Checked(reader.GetInt64(0), () => UtcText.Parse(reader.GetString(1)));
    }

    /// <summary>The highest stored serial that starts with <paramref name="prefix"/> (ordinal order), or null (serial index).</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async Task<string?> ReadHighestSerialAsync(string prefix, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrEmpty(prefix);
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT max(serial) FROM runs WHERE serial >= $low AND serial < $high;";
        command.Parameters.AddWithValue("$low", prefix);
        command.Parameters.AddWithValue("$high", prefix + "\uffff");
        await using var reader = await ExecuteAsync(command, ct).ConfigureAwait(false);
        return Read(reader) && reader.GetValue(0) is string serial ? serial : null;
    }

    /// <summary>The operator of each run matching <paramref name="filter"/>, in <c>seq</c> order (null where none was stored).</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async IAsyncEnumerable<(long Seq, string? Operator)> ReadOperatorsAsync(RunFilter filter, [EnumeratorCancellation] CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(filter);
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        var sql = new StringBuilder("SELECT r.seq, r.operator FROM runs r");
        FilterSql.AppendWhere(sql, command, filter, includeReadingNames: false);
        command.CommandText = sql.Append(" ORDER BY r.seq;").ToString();
        await using var reader = await ExecuteAsync(command, ct).ConfigureAwait(false);
        while (Read(reader))
        {
            yield return (reader.GetInt64(0), reader.GetValue(1) as string);
        }
    }

    /// <summary>Prepares <paramref name="sql"/> on the connection's handle and binds the named parameters FilterSql made.</summary>
    private sqlite3_stmt Prepare(SqliteConnection connection, string sql, SqliteParameterCollection parameters)
    {
        var db = connection.Handle!;
        Check(db, raw.sqlite3_prepare_v2(db, sql, out var statement));
        try
        {
            foreach (SqliteParameter parameter in parameters)
            {
                var index = raw.sqlite3_bind_parameter_index(statement, parameter.ParameterName);
                var rc = parameter.Value switch
                {
                    string text => raw.sqlite3_bind_text(statement, index, text),
                    int number => raw.sqlite3_bind_int64(statement, index, number),
                    long number => raw.sqlite3_bind_int64(statement, index, number),
                    var other => throw new InvalidOperationException($"Filter parameter {parameter.ParameterName} has an unexpected type {other?.GetType().Name}."),
                };
                Check(db, rc);
            }

            return statement;
        }
        catch
        {
            statement.Dispose();
            throw;
        }
    }

    private static string? PooledOrNull(Utf8StringPool pool, sqlite3_stmt statement, int column) =>
        raw.sqlite3_column_type(statement, column) == raw.SQLITE_NULL ? null : pool.Get(raw.sqlite3_column_blob(statement, column));

    private static Guid ParseGuid(sqlite3_stmt statement, int column)
    {
        var utf8 = raw.sqlite3_column_blob(statement, column);
        return Utf8Parser.TryParse(utf8, out Guid id, out var consumed, 'D') && consumed == utf8.Length
            ? id
            : Guid.ParseExact(Encoding.UTF8.GetString(utf8), "D");
    }

    private static Verdict ParseVerdict(string word) => word switch
    {
        // Exact words only: the schema's CHECK constraint allows nothing else.
        "pass" => Verdict.Pass,
        "fail" => Verdict.Fail,
        "error" => Verdict.Error,
        _ => throw new InvalidDataException($"Column verdict holds '{word}', which is not pass, fail or error."),
    };

    /// <summary>An instant in the stored layout (<see cref="UtcText.Format"/>, 28 ASCII bytes); anything else through <see cref="UtcText.Parse"/>.</summary>
    private static DateTimeOffset ParseUtc(ReadOnlySpan<byte> utf8)
    {
        if (utf8.Length == 28 && utf8[4] == '-' && utf8[7] == '-' && utf8[10] == 'T' && utf8[13] == ':' && utf8[16] == ':'
            && utf8[19] == '.' && utf8[27] == 'Z'
            && Digits(utf8, 0, 4, out var year) && Digits(utf8, 5, 2, out var month) && Digits(utf8, 8, 2, out var day)
            && Digits(utf8, 11, 2, out var hour) && Digits(utf8, 14, 2, out var minute) && Digits(utf8, 17, 2, out var second)
            && Digits(utf8, 20, 7, out var fraction)
            && year >= 1 && month is >= 1 and <= 12 && day >= 1 && day <= DateTime.DaysInMonth(year, month)
            && hour < 24 && minute < 60 && second < 60)
        {
            return new DateTimeOffset(new DateTime(year, month, day, hour, minute, second, DateTimeKind.Utc).AddTicks(fraction));
        }

        var text = Encoding.UTF8.GetString(utf8);
        try
        {
            return UtcText.Parse(text);
        }
        catch (FormatException)
        {
            throw new FormatException($"ended_utc '{(text.Length > 40 ? text[..40] + "…" : text)}' is not a stored date and time ({UtcText.Format})");
        }
    }

    private static bool Digits(ReadOnlySpan<byte> utf8, int start, int count, out int value)
    {
        value = 0;
        for (var i = start; i < start + count; i++)
        {
            var digit = utf8[i] - '0';
            if ((uint)digit > 9)
            {
                return false;
            }

            value = value * 10 + digit;
        }

        return true;
    }
}
