using System.Text.Json;
using LineTest.Storage.Json;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>Small look-ups for the live page: change marks, serial search, a unit's history, products.</summary>
public sealed partial class SqliteResultReader
{
    /// <summary>The highest stored seq and the runs in progress: two index look-ups, cheap enough to poll.</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async Task<LiveState> ReadLiveStateAsync(CancellationToken ct = default)
    {
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = """
            SELECT (SELECT coalesce(max(seq), 0) FROM runs),
                   (SELECT count(*) FROM runs_in_progress),
                   (SELECT max(updated_utc) FROM runs_in_progress);
            """;
        try
        {
            await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
            await reader.ReadAsync(ct).ConfigureAwait(false);
            return new LiveState(
                reader.GetInt64(0),
                reader.GetInt32(1),
                reader.IsDBNull(2) ? null : UtcText.Parse(reader.GetString(2)));
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }
    }

    /// <summary>Distinct serials that start with <paramref name="prefix"/> (ordinal), in order, at most <paramref name="limit"/>.</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async Task<IReadOnlyList<string>> FindSerialsAsync(string prefix, int limit, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(prefix);
        ArgumentOutOfRangeException.ThrowIfLessThan(limit, 1);
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();

        // A range on the serial index; U+10FFFF is the highest code point, so every serial with the prefix sorts below
        // prefix + U+10FFFF in SQLite's byte-wise (BINARY) order of UTF-8 text.
        command.CommandText = """
            SELECT DISTINCT serial FROM runs
            WHERE serial >= $prefix AND serial < $upper AND substr(serial, 1, length($prefix)) = $prefix
            ORDER BY serial LIMIT $limit;
            """;
        command.Parameters.AddWithValue("$prefix", prefix);
        command.Parameters.AddWithValue("$upper", prefix + char.ConvertFromUtf32(0x10FFFF));
        command.Parameters.AddWithValue("$limit", limit);
        var serials = new List<string>();
        try
        {
            await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
            while (await reader.ReadAsync(ct).ConfigureAwait(false))
            {
                serials.Add(reader.GetString(0));
            }
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }

        return serials;
    }

    /// <summary>Every stored run of <paramref name="serial"/> in time order (end, then seq), each with its record hash.</summary>
    /// <exception cref="ResultStoreException">The database cannot be read, or a stored run is not valid.</exception>
    public async Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(string serial, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(serial);
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT seq, record_sha256, run_json FROM runs WHERE serial = $serial ORDER BY ended_utc, seq;";
        command.Parameters.AddWithValue("$serial", serial);
        var runs = new List<StoredRun>();
        try
        {
            await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
            while (await reader.ReadAsync(ct).ConfigureAwait(false))
            {
                var seq = reader.GetInt64(0);
                try
                {
                    runs.Add(new StoredRun(seq, reader.GetString(1), RunJson.Deserialize(reader.GetString(2))));
                }
                catch (JsonException ex)
                {
                    throw new ResultStoreException(
                        ResultStoreFailure.Incompatible, $"Run seq {seq} in '{DatabasePath}' is not a valid stored run: {ex.Message}", ex);
                }
            }
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }

        return runs;
    }

    /// <summary>Each product with the sequence ids that tested it and their run counts, ordered by product and sequence.</summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or read.</exception>
    public async Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(CancellationToken ct = default)
    {
        await using var connection = await OpenAsync(ct).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT product, sequence_id, count(*) FROM runs GROUP BY product, sequence_id ORDER BY product, sequence_id;";
        var products = new List<ProductSequence>();
        try
        {
            await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
            while (await reader.ReadAsync(ct).ConfigureAwait(false))
            {
                products.Add(new ProductSequence(reader.GetString(0), reader.GetString(1), reader.GetInt64(2)));
            }
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be read", DatabasePath);
        }

        return products;
    }
}
