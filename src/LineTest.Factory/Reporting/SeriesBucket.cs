using System.Runtime.InteropServices;
using LineTest.Reports.Loading;

namespace LineTest.Factory.Reporting;

/// <summary>
/// The readings of one (sequence, name) from one connection, in arrival order, until they are merged with the other
/// connections' and sorted into run and reading order. Per reading a sort key (run index and ordinal), the value (NaN
/// for none) and the index of its <see cref="ReadingShape"/>: about 20 bytes.
/// </summary>
internal sealed class SeriesBucket(string sequence)
{
    private readonly Dictionary<ReadingShape, int> _shapeIndex = [];
    private readonly List<ReadingShape> _shapes = [];
    private List<long> _keys = [];
    private List<double> _values = [];
    private List<int> _shapeOf = [];
    private int _last = -1;

    public string Sequence { get; } = sequence;

    /// <summary>The reading name.</summary>
    public required string Name { get; init; }

    /// <summary>The smallest sort key (after <see cref="Sort"/>: the first reading's).</summary>
    public long FirstKey => _keys.Count == 0 ? long.MaxValue : _keys[0];

    /// <summary>The shape of the first reading (after <see cref="Sort"/>).</summary>
    public ReadingShape FirstShape => _shapes[_shapeOf[0]];

    public void Add(long key, double value, ReadingShape shape)
    {
        // Consecutive readings of a name usually share unit and limits: compared before the dictionary is asked.
        if (_last < 0 || !_shapes[_last].Equals(shape))
        {
            if (!_shapeIndex.TryGetValue(shape, out _last))
            {
                _last = AddShape(shape);
            }
        }

        _keys.Add(key);
        _values.Add(value);
        _shapeOf.Add(_last);
    }

    /// <summary>Takes over <paramref name="other"/>'s readings (same sequence and name), emptying it.</summary>
    public void Absorb(SeriesBucket other)
    {
        var map = other._shapes.Select(shape => _shapeIndex.TryGetValue(shape, out var i) ? i : AddShape(shape)).ToArray();
        _keys.AddRange(other._keys);
        _values.AddRange(other._values);
        foreach (var s in other._shapeOf)
        {
            _shapeOf.Add(map[s]);
        }

        other._keys = [];
        other._values = [];
        other._shapeOf = [];
    }

    /// <summary>Sorts the readings by key (run, then ordinal; keys are unique), in place.</summary>
    public void Sort()
    {
        var keys = CollectionsMarshal.AsSpan(_keys);
        var order = new int[keys.Length];
        for (var i = 0; i < order.Length; i++)
        {
            order[i] = i;
        }

        keys.Sort(order.AsSpan());
        var values = new List<double>(order.Length);
        var shapeOf = new List<int>(order.Length);
        foreach (var i in order)
        {
            values.Add(_values[i]);
            shapeOf.Add(_shapeOf[i]);
        }

        _values = values;
        _shapeOf = shapeOf;
    }

    /// <summary>Adds the sorted readings to <paramref name="series"/>, one by one, and lets them go.</summary>
    public void FillInto(ReadingSeries series, int ordinalBits)
    {
        series.EnsureCapacity(series.Count + _keys.Count);
        for (var i = 0; i < _keys.Count; i++)
        {
            var shape = _shapes[_shapeOf[i]];
            var value = _values[i];
            series.Add((int)(_keys[i] >> ordinalBits), double.IsNaN(value) ? null : value, shape.Unit, shape.Low, shape.High);
        }

        _keys = [];
        _values = [];
        _shapeOf = [];
    }

    private int AddShape(ReadingShape shape)
    {
        var index = _shapes.Count;
        _shapes.Add(shape);
        _shapeIndex.Add(shape, index);
        return index;
    }
}
