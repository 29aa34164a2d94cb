using System.Text;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// Joins readings to their runs by merging two ordered scans: runs by <c>seq</c> (over the covering summary
/// index) and readings by their primary key <c>(run_seq, ordinal)</c>. A SQL join would instead descend the
/// readings B-tree once per run, which costs several times more on a large database; both scans here are
/// sequential. Run conditions filter the runs scan and bound the readings scan to the matching seq range.
/// </summary>
internal sealed class ReadingJoin : IDisposable
{
    private readonly SqliteCommand _runCommand;
    private readonly SqliteCommand _readingCommand;
    private readonly SqliteDataReader? _runs;
    private readonly SqliteDataReader? _readings;
    private long _runSeq = long.MinValue;

    /// <param name="connection">An open connection.</param>
    /// <param name="filter">Run and reading-name conditions.</param>
    /// <param name="runColumns">Columns of <c>runs r</c> to read; the first must be <c>r.seq</c>.</param>
    /// <param name="readingColumns">Columns of <c>readings g</c> to read (after <c>g.run_seq</c>, which is added).</param>
    public ReadingJoin(SqliteConnection connection, RunFilter filter, string runColumns, string readingColumns)
    {
        _runCommand = connection.CreateCommand();
        var runSql = new StringBuilder($"SELECT {runColumns} FROM runs r");
        FilterSql.AppendWhere(runSql, _runCommand, filter, includeReadingNames: false);
        _runCommand.CommandText = runSql.Append(" ORDER BY r.seq;").ToString();

        _readingCommand = connection.CreateCommand();
        var conditions = new List<string>();
        if (filter.HasRunCondition)
        {
            if (FilterSql.SeqRange(connection, filter) is not var (low, high))
            {
                return;
            }

            conditions.Add("g.run_seq BETWEEN $low AND $high");
            _readingCommand.Parameters.AddWithValue("$low", low);
            _readingCommand.Parameters.AddWithValue("$high", high);
        }

        if (filter.ReadingNames is { Count: > 0 } names)
        {
            var placeholders = new List<string>(names.Count);
            foreach (var name in names)
            {
                var parameter = $"$name{placeholders.Count}";
                placeholders.Add(parameter);
                _readingCommand.Parameters.AddWithValue(parameter, name);
            }

            // The unary + keeps the planner off ix_readings_name, which would need a sort to restore run order.
            conditions.Add($"+g.name IN ({string.Join(", ", placeholders)})");
        }

        var readingSql = new StringBuilder($"SELECT g.run_seq, {readingColumns} FROM readings g");
        if (conditions.Count > 0)
        {
            readingSql.Append(" WHERE ").AppendJoin(" AND ", conditions);
        }

        _readingCommand.CommandText = readingSql.Append(" ORDER BY g.run_seq, g.ordinal;").ToString();
        _runs = _runCommand.ExecuteReader();
        _readings = _readingCommand.ExecuteReader();
    }

    /// <summary>Positioned on the current reading's run.</summary>
    public SqliteDataReader Runs => _runs!;

    /// <summary>Positioned on the current reading; column 0 is <c>run_seq</c>.</summary>
    public SqliteDataReader Readings => _readings!;

    /// <summary>True when the current reading belongs to another run than the previous one.</summary>
    public bool RunChanged { get; private set; }

    /// <summary>Moves to the next reading whose run matches the filter.</summary>
    public bool MoveNext()
    {
        if (_runs is null || _readings is null)
        {
            return false;
        }

        RunChanged = false;
        while (_readings.Read())
        {
            var readingRunSeq = _readings.GetInt64(0);
            while (_runSeq < readingRunSeq)
            {
                if (!_runs.Read())
                {
                    return false;
                }

                _runSeq = _runs.GetInt64(0);
                RunChanged = true;
            }

            if (_runSeq == readingRunSeq)
            {
                return true;
            }
        }

        return false;
    }

    public void Dispose()
    {
        _runs?.Dispose();
        _readings?.Dispose();
        _runCommand.Dispose();
        _readingCommand.Dispose();
    }

}
