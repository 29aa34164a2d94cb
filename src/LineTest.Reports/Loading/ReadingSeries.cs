namespace LineTest.Reports.Loading;

/// <summary>
/// All values of one reading name, in run order, as primitive lists: the value and the index of its run in the
/// <see cref="RunTable"/>. Missing values (no number) are counted, not stored.
/// </summary>
public sealed class ReadingSeries
{
    private List<double> _values = [];
    private List<int> _runs = [];
    private bool _seenLimits;

    /// <summary>Creates an empty series.</summary>
    public ReadingSeries(string name, string unit)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        ArgumentNullException.ThrowIfNull(unit);
        Name = name;
        Unit = unit;
    }

    /// <summary>Reading name.</summary>
    public string Name { get; }

    /// <summary>The sequence (one product) whose runs this series holds; null when the source names none.</summary>
    public string? SequenceId { get; init; }

    /// <summary>Unit symbol of the latest reading.</summary>
    public string Unit { get; private set; }

    /// <summary>Lower limit of the latest reading that had any limits.</summary>
    public double? Low { get; private set; }

    /// <summary>Upper limit of the latest reading that had any limits.</summary>
    public double? High { get; private set; }

    /// <summary>True when the limits or the unit differ between readings (e.g. a new sequence revision).</summary>
    public bool LimitsChanged { get; private set; }

    /// <summary>Readings without a numeric value.</summary>
    public int Missing { get; private set; }

    /// <summary>Number of numeric values.</summary>
    public int Count => _values.Count;

    /// <summary>The numeric values in run order.</summary>
    public ReadOnlySpan<double> Values => System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_values);

    /// <summary>For each value, the index of its run.</summary>
    public ReadOnlySpan<int> Runs => System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_runs);

    /// <summary>
    /// Makes room for <paramref name="count"/> values in all, so a source that knows how many are coming (a factory
    /// database streams a million at a time) does not have the lists grow and copy themselves step by step.
    /// </summary>
    public void EnsureCapacity(int count)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(count);
        _values.EnsureCapacity(count);
        _runs.EnsureCapacity(count);
    }

    /// <summary>Adds one reading of run <paramref name="run"/>.</summary>
    public void Add(int run, double? value, string unit, double? low, double? high)
    {
        ArgumentNullException.ThrowIfNull(unit);
        if (!string.Equals(unit, Unit, StringComparison.Ordinal))
        {
            LimitsChanged = true;
            Unit = unit;
        }

        if (low.HasValue || high.HasValue)
        {
            if (_seenLimits && (low != Low || high != High))
            {
                LimitsChanged = true;
            }

            _seenLimits = true;
            Low = low;
            High = high;
        }

        if (value is { } v && double.IsFinite(v))
        {
            _values.Add(v);
            _runs.Add(run);
        }
        else
        {
            Missing++;
        }
    }

    /// <summary>Reorders the values by <paramref name="runRank"/>[run] (a stable sort), e.g. into time order.</summary>
    internal void ReorderByRunRank(ReadOnlySpan<int> runRank)
    {
        var n = _values.Count;
        var keys = new long[n];
        var order = new int[n];
        for (var i = 0; i < n; i++)
        {
            // Rank in the high bits, position in the low bits: unique keys, so the sort is stable.
            keys[i] = ((long)runRank[_runs[i]] << 32) | (uint)i;
            order[i] = i;
        }

        Array.Sort(keys, order);
        var values = new List<double>(n);
        var runs = new List<int>(n);
        foreach (var i in order)
        {
            values.Add(_values[i]);
            runs.Add(_runs[i]);
        }

        _values = values;
        _runs = runs;
    }
}
