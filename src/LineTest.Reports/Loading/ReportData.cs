namespace LineTest.Reports.Loading;

/// <summary>
/// What a report is computed from: the runs and, per reading name, its values in run order.
/// </summary>
public sealed class ReportData
{
    private readonly Dictionary<string, ReadingSeries> _byName = new(StringComparer.Ordinal);
    private readonly List<ReadingSeries> _readings = [];
    private readonly List<string> _sources = [];

    /// <summary>The runs.</summary>
    public RunTable Runs { get; } = new();

    /// <summary>Reading series in order of first appearance.</summary>
    public IReadOnlyList<ReadingSeries> Readings => _readings;

    /// <summary>Where the data came from (database or CSV paths).</summary>
    public IReadOnlyList<string> Sources => _sources;

    /// <summary>Records a source.</summary>
    public void AddSource(string source)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(source);
        _sources.Add(source);
    }

    /// <summary>The series for <paramref name="name"/>, created on first use.</summary>
    public ReadingSeries Series(string name, string unit)
    {
        if (!_byName.TryGetValue(name, out var series))
        {
            series = new ReadingSeries(name, unit);
            _byName.Add(name, series);
            _readings.Add(series);
        }

        return series;
    }

    /// <summary>
    /// Puts every series into the time order of its runs (stable: runs that ended together keep the order they
    /// were added in). Needed when several databases are merged, since each is in its own insertion order.
    /// </summary>
    public void SortByRunTime()
    {
        var n = Runs.Count;
        var ticks = new long[n];
        var order = new int[n];
        for (var i = 0; i < n; i++)
        {
            ticks[i] = Runs.EndedUtc(i).UtcTicks;
            order[i] = i;
        }

        // Array.Sort is not stable; sorting by (ticks, index) pairs makes it so.
        Array.Sort(order, (a, b) => ticks[a] != ticks[b] ? ticks[a].CompareTo(ticks[b]) : a.CompareTo(b));
        var rank = new int[n];
        for (var r = 0; r < n; r++)
        {
            rank[order[r]] = r;
        }

        foreach (var series in _readings)
        {
            series.ReorderByRunRank(rank);
        }
    }
}
