namespace LineTest.Factory.Reporting;

/// <summary>
/// The readings one connection streamed, compactly: per reading its sort key (run index and ordinal), its value (NaN for
/// none) and the index of its <see cref="ReadingShape"/>, which take only a few distinct values. About 20 bytes each.
/// </summary>
internal sealed class ReadingPart
{
    private readonly Dictionary<ReadingShape, int> _shapeIndex = [];
    private ReadingShape _last;
    private int _lastIndex = -1;

    public List<long> Keys { get; } = [];

    public List<double> Values { get; } = [];

    public List<int> ShapeOf { get; } = [];

    public List<ReadingShape> Shapes { get; } = [];

    public int Count => Keys.Count;

    /// <summary>Lets the readings go once they are in their buckets.</summary>
    public void Clear()
    {
        Keys.Clear();
        Keys.TrimExcess();
        Values.Clear();
        Values.TrimExcess();
        ShapeOf.Clear();
        ShapeOf.TrimExcess();
    }

    public void Add(long key, double value, ReadingShape shape)
    {
        if (_lastIndex < 0 || !shape.Equals(_last))
        {
            if (!_shapeIndex.TryGetValue(shape, out _lastIndex))
            {
                _lastIndex = Shapes.Count;
                Shapes.Add(shape);
                _shapeIndex.Add(shape, _lastIndex);
            }

            _last = shape;
        }

        Keys.Add(key);
        Values.Add(value);
        ShapeOf.Add(_lastIndex);
    }
}
