using System.Text;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>Turns a <see cref="RunFilter"/> into a parameterised WHERE clause over <c>runs r</c> (and <c>readings g</c>).</summary>
internal static class FilterSql
{
    /// <summary>Appends " WHERE ..." (or nothing) to <paramref name="sql"/> and adds the parameters to <paramref name="command"/>.</summary>
    public static void AppendWhere(StringBuilder sql, SqliteCommand command, RunFilter filter, bool includeReadingNames)
    {
        var conditions = new List<string>();
        void Add(string condition, string name, object value)
        {
            conditions.Add(condition);
            command.Parameters.AddWithValue(name, value);
        }

        if (filter.FromUtc is DateTimeOffset from)
        {
            Add("r.ended_utc >= $from", "$from", UtcText.ToText(from));
        }

        if (filter.ToUtc is DateTimeOffset to)
        {
            Add("r.ended_utc < $to", "$to", UtcText.ToText(to));
        }

        if (filter.Station is not null)
        {
            Add("r.station = $station", "$station", filter.Station);
        }

        if (filter.Slot is int slot)
        {
            Add("r.slot = $slot", "$slot", slot);
        }

        if (filter.Lot is not null)
        {
            Add("r.lot = $lot", "$lot", filter.Lot);
        }

        if (filter.SequenceId is not null)
        {
            Add("r.sequence_id = $sequence", "$sequence", filter.SequenceId);
        }

        if (filter.SequenceRevision is int revision)
        {
            Add("r.sequence_revision = $revision", "$revision", revision);
        }

        if (filter.Serial is not null)
        {
            Add("r.serial = $serial", "$serial", filter.Serial);
        }

        if (filter.FirstSeq is long first)
        {
            Add("r.seq >= $firstSeq", "$firstSeq", first);
        }

        if (filter.LastSeq is long last)
        {
            Add("r.seq <= $lastSeq", "$lastSeq", last);
        }

        if (includeReadingNames && filter.ReadingNames is { Count: > 0 } names)
        {
            var placeholders = new List<string>(names.Count);
            var i = 0;
            foreach (var name in names)
            {
                var parameter = $"$name{i++}";
                placeholders.Add(parameter);
                command.Parameters.AddWithValue(parameter, name);
            }

            conditions.Add($"g.name IN ({string.Join(", ", placeholders)})");
        }

        if (conditions.Count > 0)
        {
            sql.Append(" WHERE ").AppendJoin(" AND ", conditions);
        }
    }

    /// <summary>The lowest and highest <c>seq</c> of the runs matching <paramref name="filter"/>; null when none match.</summary>
    public static (long Low, long High)? SeqRange(SqliteConnection connection, RunFilter filter)
    {
        using var range = connection.CreateCommand();
        var where = new StringBuilder();
        AppendWhere(where, range, filter, includeReadingNames: false);

        // Two ordered look-ups rather than min() and max() together, which SQLite answers by scanning every matching
        // run: this way both ends come from the seq order directly.
        range.CommandText =
            $"SELECT (SELECT r.seq FROM runs r{where} ORDER BY r.seq LIMIT 1), (SELECT r.seq FROM runs r{where} ORDER BY r.seq DESC LIMIT 1);";
        using var bounds = range.ExecuteReader();
        bounds.Read();
        return bounds.IsDBNull(0) ? null : (bounds.GetInt64(0), bounds.GetInt64(1));
    }
}
