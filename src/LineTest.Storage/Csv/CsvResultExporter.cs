using System.Globalization;
using System.Text;
using CsvHelper;
using CsvHelper.Configuration;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Csv;

/// <summary>
/// Exports runs and readings from a results database as CSV (RFC 4180: comma separated, CRLF line ends,
/// fields with commas, quotes or line breaks quoted, quotes doubled), invariant culture, one header row named
/// after the database columns. Rows are streamed from the database to the writer, so size is not limited by memory.
/// </summary>
/// <remarks>
/// Numbers are written in invariant culture with round-trip precision; instants as stored (ISO 8601 UTC);
/// absent values as empty fields. No spreadsheet-formula escaping is applied, because it would also alter
/// negative numbers; open the files with an import step rather than by double-clicking.
/// </remarks>
public sealed class CsvResultExporter
{
    /// <summary>The columns of the runs export, in order.</summary>
    public static IReadOnlyList<string> RunHeader { get; } =
    [
        "seq", .. RunColumns.Names, "prev_sha256", "record_sha256",
    ];

    /// <summary>The columns of the readings export, in order: the run's filter columns, then the reading's.</summary>
    public static IReadOnlyList<string> ReadingHeader { get; } =
    [
        "run_seq", "run_id", "serial", "run_verdict", "ended_utc", "station", "slot", "lot", "sequence_id",
        "sequence_revision", .. ReadingColumns.Names,
    ];

    private static readonly CsvConfiguration Rfc4180 = new(CultureInfo.InvariantCulture)
    {
        NewLine = "\r\n",
        Delimiter = ",",
        Quote = '"',
    };

    private readonly SqliteResultReader _reader;

    /// <summary>Creates an exporter over the database that <paramref name="reader"/> reads.</summary>
    public CsvResultExporter(SqliteResultReader reader)
    {
        ArgumentNullException.ThrowIfNull(reader);
        _reader = reader;
    }

    /// <summary>Writes one row per run matching <paramref name="filter"/>, in insertion order. Returns the row count.</summary>
    /// <exception cref="ResultStoreException">The database cannot be read.</exception>
    public Task<long> ExportRunsAsync(TextWriter writer, RunFilter? filter = null, CancellationToken ct = default)
    {
        var select = string.Join(", ", RunHeader.Select(c => "r." + c));
        return ExportAsync(writer, RunHeader, $"SELECT {select} FROM runs r", " ORDER BY r.seq;", filter, ct);
    }

    /// <summary>Writes one row per reading matching <paramref name="filter"/>, in run then reading order. Returns the row count.</summary>
    /// <exception cref="ResultStoreException">The database cannot be read.</exception>
    public async Task<long> ExportReadingsAsync(TextWriter writer, RunFilter? filter = null, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(writer);
        const int runColumnCount = 10;
        await using var connection = await _reader.OpenAsync(ct).ConfigureAwait(false);
        await using var csv = new CsvWriter(writer, Rfc4180, leaveOpen: true);
        await WriteHeaderAsync(csv, ReadingHeader).ConfigureAwait(false);
        long rows = 0;
        try
        {
            using var join = new ReadingJoin(
                connection,
                filter ?? RunFilter.All,
                "r.seq, r.id, r.serial, r.verdict, r.ended_utc, r.station, r.slot, r.lot, r.sequence_id, r.sequence_revision",
                string.Join(", ", ReadingColumns.Names.Select(c => "g." + c)));
            while (join.MoveNext())
            {
                ct.ThrowIfCancellationRequested();
                for (var i = 0; i < runColumnCount; i++)
                {
                    csv.WriteField(Format(join.Runs, i));
                }

                for (var i = 1; i <= ReadingColumns.Names.Length; i++)
                {
                    csv.WriteField(Format(join.Readings, i));
                }

                await csv.NextRecordAsync().ConfigureAwait(false);
                rows++;
            }
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be exported", _reader.DatabasePath);
        }

        await csv.FlushAsync().ConfigureAwait(false);
        return rows;
    }

    private async Task<long> ExportAsync(
        TextWriter writer,
        IReadOnlyList<string> header,
        string select,
        string order,
        RunFilter? filter,
        CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(writer);
        await using var connection = await _reader.OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        var sql = new StringBuilder(select);
        FilterSql.AppendWhere(sql, command, filter ?? RunFilter.All, includeReadingNames: false);
        sql.Append(order);
        command.CommandText = sql.ToString();

        await using var csv = new CsvWriter(writer, Rfc4180, leaveOpen: true);
        await WriteHeaderAsync(csv, header).ConfigureAwait(false);
        long rows = 0;
        try
        {
            using var reader = command.ExecuteReader();
            while (reader.Read())
            {
                ct.ThrowIfCancellationRequested();
                for (var i = 0; i < header.Count; i++)
                {
                    csv.WriteField(Format(reader, i));
                }

                await csv.NextRecordAsync().ConfigureAwait(false);
                rows++;
            }
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be exported", _reader.DatabasePath);
        }

        await csv.FlushAsync().ConfigureAwait(false);
        return rows;
    }

    private static async Task WriteHeaderAsync(CsvWriter csv, IReadOnlyList<string> header)
    {
        foreach (var name in header)
        {
            csv.WriteField(name);
        }

        await csv.NextRecordAsync().ConfigureAwait(false);
    }

    private static string Format(SqliteDataReader reader, int ordinal) => reader.GetFieldType(ordinal) switch
    {
        _ when reader.IsDBNull(ordinal) => string.Empty,
        var t when t == typeof(long) => reader.GetInt64(ordinal).ToString(CultureInfo.InvariantCulture),
        var t when t == typeof(double) => reader.GetDouble(ordinal).ToString("R", CultureInfo.InvariantCulture),
        _ => reader.GetString(ordinal),
    };
}
