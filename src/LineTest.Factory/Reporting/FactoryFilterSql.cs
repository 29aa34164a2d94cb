using System.Text;
using LineTest.Reports.Loading;
using Npgsql;
using NpgsqlTypes;

namespace LineTest.Factory.Reporting;

/// <summary>Turns a <see cref="ReportQuery"/> into WHERE conditions over the factory's <c>runs</c> and <c>readings</c>.</summary>
internal static class FactoryFilterSql
{
    /// <summary>
    /// Conditions on table alias <paramref name="alias"/>. The time window is given twice: on <c>ended_utc</c> (the
    /// partition key, so months outside it are never read) and on <c>ended_ticks</c> (the station's exact instant, so
    /// the window is the same to the 100 ns as a folder report's). Only the time and the station are asked of readings
    /// (<paramref name="runConditions"/> false); the other run conditions drop their readings when joined to the runs.
    /// A <paramref name="month"/> adds, last, <c>ended_utc</c> in [From, To): one partition.
    /// </summary>
    public static string Where(ReportQuery query, string alias, NpgsqlCommand command, bool runConditions, (DateTime From, DateTime To)? month = null)
    {
        ArgumentNullException.ThrowIfNull(command);
        return Where(query, alias, runConditions, month, (name, type, value) =>
        {
            command.Parameters.Add(new NpgsqlParameter(name, type) { Value = value });
            return "@" + name;
        });
    }

    /// <summary>
    /// The same conditions as <see cref="Where(ReportQuery, string, NpgsqlCommand, bool, ValueTuple{DateTime, DateTime}?)"/>
    /// with the values written in as literals (<see cref="SqlLiteral"/>), for a <c>COPY (query) TO STDOUT</c>, which
    /// takes no parameters.
    /// </summary>
    public static string WhereLiteral(ReportQuery query, string alias, bool runConditions, (DateTime From, DateTime To)? month = null) =>
        Where(query, alias, runConditions, month, (_, type, value) => SqlLiteral.Of(type, value));

    /// <summary>The conditions, each value written by <paramref name="value"/> (name, type, value → SQL text).</summary>
    private static string Where(
        ReportQuery query, string alias, bool runConditions, (DateTime From, DateTime To)? month, Func<string, NpgsqlDbType, object, string> value)
    {
        ArgumentNullException.ThrowIfNull(query);
        var conditions = new List<string>();
        void Add(string condition, string name, NpgsqlDbType type, object v) =>
            conditions.Add(condition.Replace("@" + name, value(name, type, v), StringComparison.Ordinal));

        if (query.FromUtc is { } from)
        {
            Add($"{alias}.ended_ticks >= @from_ticks", "from_ticks", NpgsqlDbType.Bigint, from.UtcTicks);
            Add($"{alias}.ended_utc >= @from_utc", "from_utc", NpgsqlDbType.TimestampTz, Microseconds(from));
        }

        if (query.ToUtc is { } to)
        {
            Add($"{alias}.ended_ticks < @to_ticks", "to_ticks", NpgsqlDbType.Bigint, to.UtcTicks);
            Add($"{alias}.ended_utc <= @to_utc", "to_utc", NpgsqlDbType.TimestampTz, Microseconds(to));
        }

        if (query.Station is not null)
        {
            Add($"{alias}.station = @station", "station", NpgsqlDbType.Text, query.Station);
        }

        if (runConditions)
        {
            if (query.Slot is int slot)
            {
                Add($"{alias}.slot = @slot", "slot", NpgsqlDbType.Integer, slot);
            }

            if (query.Lot is not null)
            {
                Add($"{alias}.lot = @lot", "lot", NpgsqlDbType.Text, query.Lot);
            }

            if (query.SequenceId is not null)
            {
                Add($"{alias}.sequence_id = @sequence", "sequence", NpgsqlDbType.Text, query.SequenceId);
            }

            if (query.SequenceRevision is int revision)
            {
                Add($"{alias}.sequence_revision = @revision", "revision", NpgsqlDbType.Integer, revision);
            }
        }
        else if (query.ReadingNames.Count > 0)
        {
            Add($"{alias}.name = ANY(@names)", "names", NpgsqlDbType.Array | NpgsqlDbType.Text, query.ReadingNames.ToArray());
        }

        if (month is { } range)
        {
            Add($"{alias}.ended_utc >= @month_from", "month_from", NpgsqlDbType.TimestampTz, range.From);
            Add($"{alias}.ended_utc < @month_to", "month_to", NpgsqlDbType.TimestampTz, range.To);
        }

        return conditions.Count == 0 ? string.Empty : new StringBuilder(" WHERE ").AppendJoin(" AND ", conditions).ToString();
    }

    // timestamptz keeps microseconds: truncate, so the coarse condition never excludes what the exact one keeps.
    private static DateTime Microseconds(DateTimeOffset instant)
    {
        var ticks = instant.UtcTicks;
        return new DateTime(ticks - (ticks % 10), DateTimeKind.Utc);
    }
}
