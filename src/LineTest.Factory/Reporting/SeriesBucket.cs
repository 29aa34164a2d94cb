using LineTest.Reports.Loading;

namespace LineTest.Factory.Reporting;

/// <summary>The readings of one (sequence, name) in arrival order, until they are sorted into run and reading order.</summary>
internal sealed class SeriesBucket(string sequence)
{
    private readonly Dictionary<ReadingShape, int> _shapeIndex = [];
    private readonly List<ReadingShape> _shapes = [];
    private List<long> _keys = [];
    private List<double> _values = [];
    private List<int> _shapeOf = [];

    public string Sequence { get; } = sequence;

    /// <summary>The smallest sort key (after <see cref="Sorted"/>: the first reading's).</summary>
    public long FirstKey => _keys.Count == 0 ? long.MaxValue : _keys[0];

    /// <summary>The shape of the first reading (after <see cref="Sorted"/>).</summary>
    public ReadingShape FirstShape => _shapes[_shapeOf[0]];

    public void Add(long key, double value, ReadingShape shape)
    {
        if (!_shapeIndex.TryGetValue(shape, out var index))
        {
            index = _shapes.Count;
            _shapes.Add(shape);
            _shapeIndex.Add(shape, index);
        }

        _keys.Add(key);
        _values.Add(value);
        _shapeOf.Add(index);
    }

    /// <summary>Sorts the readings by key (run, then ordinal; keys are unique) and returns this bucket.</summary>
    public SeriesBucket Sorted()
    {
        var keys = _keys.ToArray();
        var order = new int[keys.Length];
        for (var i = 0; i < order.Length; i++)
        {
            order[i] = i;
        }

        Array.Sort(keys, order);
        var values = new List<double>(keys.Length);
        var shapeOf = new List<int>(keys.Length);
        foreach (var i in order)
        {
            values.Add(_values[i]);
            shapeOf.Add(_shapeOf[i]);
        }

        _keys = [.. keys];
        _values = values;
        _shapeOf = shapeOf;
        return this;
    }

    /// <summary>Adds the sorted readings to <paramref name="series"/>, one by one.</summary>
    public void FillInto(ReadingSeries series, int ordinalBits)
    {
        for (var i = 0; i < _keys.Count; i++)
        {
            var shape = _shapes[_shapeOf[i]];
            var value = _values[i];
            series.Add((int)(_keys[i] >> ordinalBits), double.IsNaN(value) ? null : value, shape.Unit, shape.Low, shape.High);
        }
    }
}
