using System.Globalization;
using LineTest.Core.Results;
using LineTest.Reports.Loading;
using LineTest.Storage.Json;
using LineTest.Storage.Sqlite;
using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// The live page's reads of the factory database: what changed, what each station's forwarding has delivered, runs
/// without their readings, products, serials and one unit's history. Every query is a read; filters go into SQL
/// (<see cref="FactoryFilterSql"/>, the report loader's conditions) so only the selected runs leave the server.
/// </summary>
public static class FactoryPageQueries
{
    /// <summary>A text that changes whenever a batch is committed or a run refused: two small tables, cheap to poll.</summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or is not a factory database.</exception>
    public static async Task<string> ReadChangeMarkAsync(NpgsqlDataSource dataSource, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        await using var command = dataSource.CreateCommand("""
            SELECT (SELECT coalesce(sum(runs), 0) || ',' || coalesce(max(updated_utc)::text, '-') FROM chains)
                   || ';' || (SELECT coalesce(max(id), 0) FROM alarms);
            """);
        return (string)(await command.ExecuteScalarAsync(ct).ConfigureAwait(false))!;
    }

    /// <summary>Every station that has forwarded a run, in station order, with what the factory holds of it.</summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or is not a factory database.</exception>
    public static async Task<IReadOnlyList<FactoryStationHead>> ReadStationsAsync(NpgsqlDataSource dataSource, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);

        // The head run of each chain through the chain index; refused runs per station from the (small) alarms table.
        await using var command = dataSource.CreateCommand("""
            SELECT c.station, c.head_seq, c.runs, c.updated_utc, h.ended_ticks,
                   (SELECT count(*) FROM alarms a WHERE a.station = c.station)
              FROM chains c
              LEFT JOIN LATERAL (SELECT r.ended_ticks FROM runs r WHERE r.chain_id = c.chain_id AND r.station_seq = c.head_seq LIMIT 1) h ON true
             ORDER BY c.station, c.updated_utc;
            """);
        var stations = new List<FactoryStationHead>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var station = reader.GetString(0);
            var head = new FactoryStationHead(
                station,
                1,
                reader.GetInt64(2),
                reader.GetInt64(1),
                new DateTimeOffset(reader.GetFieldValue<DateTime>(3), TimeSpan.Zero),
                reader.IsDBNull(4) ? null : new DateTimeOffset(reader.GetInt64(4), TimeSpan.Zero),
                reader.GetInt64(5));
            if (stations.Count > 0 && stations[^1].Station == station)
            {
                // A later chain of the same station (its database was replaced): the newest chain's head, every chain's runs.
                var before = stations[^1];
                head = head with { Chains = before.Chains + 1, RunsHeld = before.RunsHeld + head.RunsHeld };
                stations[^1] = head;
            }
            else
            {
                stations.Add(head);
            }
        }

        return stations;
    }

    /// <summary>
    /// The runs matching <paramref name="query"/>, without readings, into <paramref name="runs"/> in the report loader's
    /// run order (end instant, station, station database, seq).
    /// </summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    public static async Task LoadRunsAsync(NpgsqlDataSource dataSource, ReportQuery query, RunTable runs, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        ArgumentNullException.ThrowIfNull(query);
        ArgumentNullException.ThrowIfNull(runs);
        await using var connection = await dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        await using var command = new NpgsqlCommand(string.Empty, connection);
        var where = FactoryFilterSql.Where(query, "r", command, runConditions: true);
        command.CommandText = $"""
            SELECT r.ended_ticks, r.serial, r.verdict, r.station, r.slot, r.lot, r.sequence_id, r.sequence_revision,
                   r.first_failing_reading, r.reason
              FROM runs r{where} ORDER BY {FactoryYieldCounter.RunOrder("r")};
            """;
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            runs.Add(
                reader.GetString(1),
                new DateTimeOffset(reader.GetInt64(0), TimeSpan.Zero),
                FactoryYieldCounter.ParseVerdict(reader.GetString(2)),
                reader.GetString(3),
                reader.GetInt32(4),
                reader.IsDBNull(5) ? null : reader.GetString(5),
                reader.GetString(6),
                reader.GetInt32(7),
                reader.IsDBNull(8) ? null : reader.GetString(8),
                reader.IsDBNull(9) ? null : reader.GetString(9));
        }
    }

    /// <summary>Products with the sequences that tested them and their runs, in order.</summary>
    /// <remarks>Reads every run's product and sequence (a scan of <c>runs</c>): callers cache it.</remarks>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    public static async Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(NpgsqlDataSource dataSource, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        await using var command = dataSource.CreateCommand(
            "SELECT product, sequence_id, count(*) FROM runs GROUP BY product, sequence_id ORDER BY product COLLATE \"C\", sequence_id;");
        var products = new List<ProductSequence>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            products.Add(new ProductSequence(reader.GetString(0), reader.GetString(1), reader.GetInt64(2)));
        }

        return products;
    }

    /// <summary>Serials that start with <paramref name="prefix"/>, in ordinal order, at most <paramref name="limit"/>.</summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    public static async Task<IReadOnlyList<string>> FindSerialsAsync(NpgsqlDataSource dataSource, string prefix, int limit, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        ArgumentNullException.ThrowIfNull(prefix);
        ArgumentOutOfRangeException.ThrowIfLessThan(limit, 1);
        await using var command = dataSource.CreateCommand(
            "SELECT DISTINCT serial COLLATE \"C\" FROM runs WHERE starts_with(serial, @prefix) ORDER BY 1 LIMIT @limit;");
        command.Parameters.AddWithValue("prefix", prefix);
        command.Parameters.AddWithValue("limit", limit);
        var serials = new List<string>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            serials.Add(reader.GetString(0));
        }

        return serials;
    }

    /// <summary>Every run of <paramref name="serial"/> at every station, in run order, read from the text its hash covers.</summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    /// <exception cref="InvalidDataException">A stored run's text is not a run record.</exception>
    public static async Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(NpgsqlDataSource dataSource, string serial, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        ArgumentNullException.ThrowIfNull(serial);
        await using var command = dataSource.CreateCommand(
            $"SELECT r.station, r.station_seq, r.record_sha256, r.run_json FROM runs r WHERE r.serial = @serial ORDER BY {FactoryYieldCounter.RunOrder("r")};");
        command.Parameters.AddWithValue("serial", serial);
        var runs = new List<StoredRun>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            RunRecord run;
            try
            {
                run = RunJson.Deserialize(reader.GetString(3));
            }
            catch (System.Text.Json.JsonException ex)
            {
                throw new InvalidDataException(
                    string.Create(CultureInfo.InvariantCulture, $"The run of station {reader.GetString(0)} at seq {reader.GetInt64(1)} is not a run record: {ex.Message}"), ex);
            }

            runs.Add(new StoredRun(reader.GetInt64(1), reader.GetString(2), run));
        }

        return runs;
    }
}
