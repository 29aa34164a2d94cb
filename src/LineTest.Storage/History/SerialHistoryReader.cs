using System.Globalization;
using LineTest.Core.Results;
using LineTest.Core.Scanning;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.History;

/// <summary>
/// A unit's history: every stored run of one serial, in time (insertion) order, read through the serial index. Used
/// by the station when a serial is scanned (retest or already passed today), by <c>history SERIAL</c> on the operator
/// screen and by <c>linetest history</c>.
/// </summary>
public sealed class SerialHistoryReader
{
    private readonly SqliteResultReader _reader;

    /// <summary>A reader of <c>results.db</c> in <paramref name="resultsDirectory"/>.</summary>
    public SerialHistoryReader(string resultsDirectory)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsDirectory);
        _reader = SqliteResultReader.InDirectory(resultsDirectory);
    }

    /// <summary>The database file.</summary>
    public string DatabasePath => _reader.DatabasePath;

    /// <summary>Every run of <paramref name="serial"/>, oldest first; empty when the database does not exist yet.</summary>
    /// <exception cref="ResultStoreException">The database cannot be read.</exception>
    public async Task<IReadOnlyList<HistoryEntry>> ReadAsync(string serial, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(serial);
        if (!File.Exists(DatabasePath))
        {
            return [];
        }

        await using var connection = await _reader.OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText =
            "SELECT seq, ended_utc, station, slot, verdict, reason, first_failing_reading, json_extract(run_json, '$.disposition'), " +
            "lot, operator, sequence_id, sequence_revision FROM runs INDEXED BY ix_runs_serial WHERE serial = $serial ORDER BY seq;";
        command.Parameters.AddWithValue("$serial", serial.Trim());
        var entries = new List<HistoryEntry>();
        try
        {
            await using var rows = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
            while (await rows.ReadAsync(ct).ConfigureAwait(false))
            {
                entries.Add(new HistoryEntry(
                    rows.GetInt64(0),
                    DateTimeOffset.Parse(rows.GetString(1), CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal),
                    rows.GetString(2),
                    rows.GetInt32(3),
                    VerdictExtensions.ParseWord(rows.GetString(4)) ?? Verdict.Error,
                    Text(rows, 5),
                    Text(rows, 6),
                    Text(rows, 7),
                    Text(rows, 8),
                    Text(rows, 9),
                    rows.GetString(10),
                    rows.GetInt32(11)));
            }
        }
        catch (SqliteException ex)
        {
            throw new ResultStoreException(ResultStoreFailure.Other, $"The history of {serial} could not be read from '{DatabasePath}': {ex.Message}", ex);
        }

        return entries;
    }

    /// <summary>What the scan rules need: how many runs the serial had and whether one passed since <paramref name="dayStartUtc"/>.</summary>
    /// <exception cref="ResultStoreException">The database cannot be read.</exception>
    public async Task<SerialHistory> ForScanAsync(string serial, DateTimeOffset dayStartUtc, CancellationToken ct)
    {
        var runs = await ReadAsync(serial, ct).ConfigureAwait(false);
        return runs.Count == 0
            ? SerialHistory.None
            : new SerialHistory(runs.Count, runs.Any(r => r.Verdict == Verdict.Pass && r.EndedUtc >= dayStartUtc));
    }

    private static string? Text(SqliteDataReader rows, int ordinal) => rows.IsDBNull(ordinal) ? null : rows.GetString(ordinal);
}
