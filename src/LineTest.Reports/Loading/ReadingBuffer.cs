using LineTest.Storage.Sqlite;

namespace LineTest.Reports.Loading;

/// <summary>
/// The readings of one seq range, held compactly until their runs are known: per reading its run's seq, its value
/// and the index of its (name, unit, limits), which take only a few distinct values. About 20 bytes a reading.
/// </summary>
internal sealed class ReadingBuffer
{
    private readonly Chunks<long> _seqs = new();
    private readonly Chunks<double> _values = new();
    private readonly Chunks<int> _shapes = new();
    private readonly List<Shape> _shapeList = [];
    private readonly Dictionary<Shape, int> _shapeIndex = [];

    /// <summary>
    /// Reads the readings of the runs matching <paramref name="filter"/> (one seq range) into a buffer; with
    /// <paramref name="damaged"/>, damaged readings are left out and their runs recorded there.
    /// </summary>
    public static async Task<ReadingBuffer> FillAsync(SqliteResultReader reader, RunFilter filter, DamagedRuns? damaged, CancellationToken ct)
    {
        var buffer = new ReadingBuffer();
        var last = default(Shape);
        var lastIndex = -1;
        await foreach (var row in reader.ReadReadingValuesAsync(filter, damaged, ct).ConfigureAwait(false))
        {
            // Names and units are shared instances within a scan, so consecutive readings of one shape compare
            // by reference first.
            var shape = new Shape(row.Name, row.Unit, row.Low, row.High);
            if (lastIndex < 0 || !shape.Equals(last))
            {
                if (!buffer._shapeIndex.TryGetValue(shape, out lastIndex))
                {
                    lastIndex = buffer._shapeList.Count;
                    buffer._shapeList.Add(shape);
                    buffer._shapeIndex.Add(shape, lastIndex);
                }

                last = shape;
            }

            buffer._seqs.Add(row.RunSeq);
            // SQLite keeps no NaN (it stores NULL), so NaN stands for "no value" without ambiguity.
            buffer._values.Add(row.Value ?? double.NaN);
            buffer._shapes.Add(lastIndex);
        }

        return buffer;
    }

    /// <summary>
    /// Adds the buffered readings to their series in <paramref name="data"/>. <paramref name="seqs"/> are the loaded
    /// runs' seqs in ascending order, the run at <c>seqs[i]</c> having index <paramref name="firstIndex"/> + i; the
    /// walk starts at <paramref name="position"/> and its end is returned for the next buffer. Readings whose run is
    /// not among the loaded runs are left out, so yield and readings describe the same runs.
    /// </summary>
    public int AddTo(ReportData data, List<long> seqs, int firstIndex, int position)
    {
        // Series per (sequence, shape): one array of series per sequence, the last one used kept at hand.
        var bySequence = new Dictionary<int, ReadingSeries?[]>();
        var lastKey = int.MinValue;
        ReadingSeries?[] series = [];
        for (var i = 0; i < _seqs.Count; i++)
        {
            var seq = _seqs[i];
            while (position < seqs.Count && seqs[position] < seq)
            {
                position++;
            }

            if (position == seqs.Count || seqs[position] != seq)
            {
                continue;
            }

            var run = firstIndex + position;
            var key = data.Runs.SequenceKey(run);
            if (key != lastKey)
            {
                if (!bySequence.TryGetValue(key, out series!))
                {
                    series = new ReadingSeries?[_shapeList.Count];
                    bySequence.Add(key, series);
                }

                lastKey = key;
            }

            var shape = _shapeList[_shapes[i]];
            var target = series[_shapes[i]] ??= data.Series(data.Runs.SequenceId(run), shape.Name, shape.Unit);
            var value = _values[i];
            target.Add(run, double.IsNaN(value) ? null : value, shape.Unit, shape.Low, shape.High);
        }

        return position;
    }

    private readonly record struct Shape(string Name, string Unit, double? Low, double? High);

    /// <summary>
    /// An append-only list in fixed chunks: millions of entries without the copying of a growing list, whose doubling
    /// copies would move every entry again.
    /// </summary>
    private sealed class Chunks<T>
    {
        private const int Shift = 17;
        private const int Mask = (1 << Shift) - 1;
        private readonly List<T[]> _chunks = [];

        public int Count { get; private set; }

        public T this[int index] => _chunks[index >> Shift][index & Mask];

        public void Add(T item)
        {
            if ((Count & Mask) == 0)
            {
                _chunks.Add(new T[1 << Shift]);
            }

            _chunks[^1][Count & Mask] = item;
            Count++;
        }
    }
}
