using LineTest.Core.Results;
using LineTest.Factory.Schema;
using LineTest.Reports.Loading;
using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Loads report data from the factory database, in the form <see cref="ResultsLoader"/> gives for station folders, so
/// the same <c>ReportBuilder</c> and writers make the same report. SQL does the filtering (partition pruning on the
/// month, indexes on station and lot) and the ordering; runs and readings are streamed in the factory's run order,
/// (end instant, station, station database, seq), which is the order a folder report puts merged stations in.
/// </summary>
public static class FactoryReportLoader
{
    private const string RunOrder = "ended_ticks, station, chain_id, station_seq";

    /// <summary>Loads the runs and readings matching <paramref name="query"/>.</summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    public static async Task<ReportData> LoadAsync(NpgsqlDataSource dataSource, ReportQuery query, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        ArgumentNullException.ThrowIfNull(query);
        var data = new ReportData();
        data.AddSource(FactoryConnection.Describe(dataSource));

        // Both scans in one repeatable-read snapshot: stations forwarding meanwhile do not make runs and readings disagree.
        await using var connection = await dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        await using var transaction = await connection.BeginTransactionAsync(System.Data.IsolationLevel.RepeatableRead, ct).ConfigureAwait(false);
        var index = await LoadRunsAsync(connection, transaction, query, data, ct).ConfigureAwait(false);
        if (index.Count == 0)
        {
            return data;
        }

        await using var command = new NpgsqlCommand(string.Empty, connection, transaction);
        var where = FactoryFilterSql.Where(query, "g", command, runConditions: false);
        command.CommandText = $"SELECT g.chain_id, g.station_seq, g.name, g.value, g.unit, g.low, g.high FROM readings g{where} ORDER BY g.{RunOrder.Replace(", ", ", g.", StringComparison.Ordinal)}, g.ordinal;";
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        // Readings are analysed per (sequence, name), never pooled across products, as for station folders.
        var names = new Dictionary<(string Sequence, string Name), ReadingSeries>();
        var units = new Dictionary<string, string>(StringComparer.Ordinal);
        var lastKey = (Guid.Empty, -1L);
        var run = -1;
        var sequence = string.Empty;
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var key = (reader.GetGuid(0), reader.GetInt64(1));
            if (key != lastKey)
            {
                lastKey = key;
                (run, sequence) = index.TryGetValue(key, out var found) ? found : (-1, string.Empty);
            }

            if (run < 0)
            {
                // A reading of a run the run conditions (slot, lot, sequence) left out.
                continue;
            }

            var name = reader.GetString(2);
            var unitText = reader.GetString(4);
            var unit = units.TryGetValue(unitText, out var shared) ? shared : units[unitText] = unitText;
            if (!names.TryGetValue((sequence, name), out var series))
            {
                series = data.Series(sequence, name, unit);
                names.Add((sequence, name), series);
            }

            series.Add(run, reader.IsDBNull(3) ? null : reader.GetDouble(3), unit, NullableDouble(reader, 5), NullableDouble(reader, 6));
        }

        return data;
    }

    private static async Task<Dictionary<(Guid, long), (int Run, string Sequence)>> LoadRunsAsync(
        NpgsqlConnection connection, NpgsqlTransaction transaction, ReportQuery query, ReportData data, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(string.Empty, connection, transaction);
        var where = FactoryFilterSql.Where(query, "r", command, runConditions: true);
        command.CommandText = $"""
            SELECT r.chain_id, r.station_seq, r.ended_ticks, r.serial, r.verdict, r.station, r.slot, r.lot, r.sequence_id,
                   r.sequence_revision, r.first_failing_reading, r.reason, r.product
              FROM runs r{where} ORDER BY r.{RunOrder.Replace(", ", ", r.", StringComparison.Ordinal)};
            """;
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        var index = new Dictionary<(Guid, long), (int, string)>();
        var runs = data.Runs;
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var sequenceId = reader.GetString(8);
            if (!data.Products.ContainsKey(sequenceId))
            {
                // The product of a sequence's first run, as the folder loader takes it.
                data.AddProduct(sequenceId, reader.GetString(12));
            }

            var at = runs.Add(
                reader.GetString(3),
                new DateTimeOffset(reader.GetInt64(2), TimeSpan.Zero),
                ParseVerdict(reader.GetString(4)),
                reader.GetString(5),
                reader.GetInt32(6),
                NullableString(reader, 7),
                reader.GetString(8),
                reader.GetInt32(9),
                NullableString(reader, 10),
                NullableString(reader, 11));
            index.Add((reader.GetGuid(0), reader.GetInt64(1)), (at, sequenceId));
        }

        return index;
    }

    private static Verdict ParseVerdict(string word) => word switch
    {
        "pass" => Verdict.Pass,
        "fail" => Verdict.Fail,
        "error" => Verdict.Error,
        _ => throw new InvalidDataException($"Column verdict holds '{word}', which is not pass, fail or error."),
    };

    private static string? NullableString(NpgsqlDataReader reader, int ordinal) => reader.IsDBNull(ordinal) ? null : reader.GetString(ordinal);

    private static double? NullableDouble(NpgsqlDataReader reader, int ordinal) => reader.IsDBNull(ordinal) ? null : reader.GetDouble(ordinal);
}
