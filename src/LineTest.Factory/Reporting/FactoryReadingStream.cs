using LineTest.Reports.Loading;
using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Streams the readings of the loaded runs into their series, in run order and then reading order, with a forward-only
/// reader of just the columns a series needs. The readings carry their run's order key, so they come from the
/// readings' primary key without a join, and each finds its run by walking the <see cref="RunIndex"/> forward.
/// </summary>
internal static class FactoryReadingStream
{
    /// <summary>Adds every reading of the runs in <paramref name="runs"/> to <paramref name="data"/>'s series.</summary>
    public static async Task ReadAsync(
        NpgsqlConnection connection, NpgsqlTransaction transaction, ReportQuery query, RunIndex runs, ReportData data, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(string.Empty, connection, transaction) { CommandTimeout = 0 };
        var where = FactoryFilterSql.Where(query, "g", command, runConditions: false);
        command.CommandText = $"""
            SELECT g.ended_ticks, g.chain_id, g.station_seq, g.name, g.value, g.unit, g.low, g.high
              FROM readings g{where} ORDER BY {FactoryYieldCounter.RunOrder("g")}, g.ordinal;
            """;
        await using var reader = await command.ExecuteReaderAsync(System.Data.CommandBehavior.SequentialAccess, ct).ConfigureAwait(false);

        // Readings are analysed per (sequence, name), never pooled across products, as for station folders. Names and
        // units repeat: the last ones read are kept to skip the dictionary for a run's readings in the usual order.
        var names = new Dictionary<(string Sequence, string Name), ReadingSeries>();
        var units = new Dictionary<string, string>(StringComparer.Ordinal);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var run = runs.Find(reader.GetInt64(0), reader.GetGuid(1), reader.GetInt64(2));
            if (run < 0)
            {
                // A reading of a run the run conditions (slot, lot, sequence) left out.
                continue;
            }

            var name = reader.GetString(3);
            double? value = reader.IsDBNull(4) ? null : reader.GetDouble(4);
            var unitText = reader.GetString(5);
            double? low = reader.IsDBNull(6) ? null : reader.GetDouble(6);
            double? high = reader.IsDBNull(7) ? null : reader.GetDouble(7);
            var unit = units.TryGetValue(unitText, out var shared) ? shared : units[unitText] = unitText;
            var sequence = data.Runs.SequenceId(run)!;
            if (!names.TryGetValue((sequence, name), out var series))
            {
                series = data.Series(sequence, name, unit);
                names.Add((sequence, name), series);
            }

            series.Add(run, value, unit, low, high);
        }
    }
}
