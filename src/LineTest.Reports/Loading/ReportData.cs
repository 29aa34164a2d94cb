namespace LineTest.Reports.Loading;

/// <summary>
/// What a report is computed from: the runs and, per reading name, its values in run order.
/// </summary>
public sealed class ReportData
{
    private readonly Dictionary<(string? Sequence, string Name), ReadingSeries> _byName = [];
    private readonly Dictionary<string, string> _products = new(StringComparer.Ordinal);
    private readonly List<ReadingSeries> _readings = [];
    private readonly List<string> _sources = [];
    private readonly List<string> _skipped = [];

    /// <summary>The runs.</summary>
    public RunTable Runs { get; } = new();

    /// <summary>
    /// Yield counted by the source (null: the report counts it from <see cref="Runs"/>, which then need their
    /// outcomes).
    /// </summary>
    public YieldTally? Tally { get; set; }

    /// <summary>Reading series in order of first appearance.</summary>
    public IReadOnlyList<ReadingSeries> Readings => _readings;

    /// <summary>Where the data came from (database or CSV paths).</summary>
    public IReadOnlyList<string> Sources => _sources;

    /// <summary>Input rows left out by <c>--skip-bad-rows</c>, each with its line and reason; every report format names them.</summary>
    public IReadOnlyList<string> SkippedRows => _skipped;

    /// <summary>Records a skipped row ("line 12: value 'abc' is not a number").</summary>
    public void AddSkippedRow(string description)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(description);
        _skipped.Add(description);
    }

    /// <summary>Records a source.</summary>
    public void AddSource(string source)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(source);
        _sources.Add(source);
    }

    /// <summary>Product name per sequence id, where the source names it.</summary>
    public IReadOnlyDictionary<string, string> Products => _products;

    /// <summary>Records the product a sequence tests.</summary>
    public void AddProduct(string sequenceId, string product)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(sequenceId);
        ArgumentException.ThrowIfNullOrWhiteSpace(product);
        _products[sequenceId] = product;
    }

    /// <summary>The series for <paramref name="name"/> without a sequence, created on first use.</summary>
    public ReadingSeries Series(string name, string unit) => Series(null, name, unit);

    /// <summary>
    /// The series for <paramref name="name"/> of sequence <paramref name="sequenceId"/>, created on first use. A
    /// reading of one name in two sequences is two series: products are never pooled.
    /// </summary>
    public ReadingSeries Series(string? sequenceId, string name, string unit)
    {
        if (!_byName.TryGetValue((sequenceId, name), out var series))
        {
            series = new ReadingSeries(name, unit) { SequenceId = sequenceId };
            _byName.Add((sequenceId, name), series);
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
