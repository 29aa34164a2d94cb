namespace LineTest.Factory.Reporting;

/// <summary>
/// The loaded runs' keys in run order (end ticks, then station database and seq), so readings streamed in the same
/// order find their run by walking forward, without a hash lookup per reading. Readings of runs that were not loaded
/// (left out by slot, lot or sequence) are passed over.
/// </summary>
internal sealed class RunIndex
{
    private readonly List<long> _ticks = [];
    private readonly List<Guid> _chains = [];
    private readonly List<long> _seqs = [];
    private readonly List<bool>? _firstRuns;
    private int _position;
    private Guid _lastChain;
    private long _lastSeq = -1;
    private int _lastRun = -1;

    /// <summary>Creates an empty index; <paramref name="firstRuns"/>: keep a first-run flag per run.</summary>
    public RunIndex(bool firstRuns)
    {
        _firstRuns = firstRuns ? [] : null;
    }

    /// <summary>Per run, true when it is its unit's first run; null when not kept.</summary>
    public bool[]? FirstRunFlags => _firstRuns?.ToArray();

    /// <summary>Number of runs.</summary>
    public int Count => _ticks.Count;

    /// <summary>Adds the next run (in run order).</summary>
    public void Add(long endedTicks, Guid chain, long seq, bool firstRun)
    {
        _firstRuns?.Add(firstRun);
        _ticks.Add(endedTicks);
        _chains.Add(chain);
        _seqs.Add(seq);
    }

    /// <summary>
    /// The index of the run (<paramref name="endedTicks"/>, <paramref name="chain"/>, <paramref name="seq"/>), or -1
    /// when it was not loaded. Calls must come in run order.
    /// </summary>
    public int Find(long endedTicks, Guid chain, long seq)
    {
        if (seq == _lastSeq && chain == _lastChain)
        {
            return _lastRun;
        }

        while (_position < _ticks.Count && _ticks[_position] < endedTicks)
        {
            _position++;
        }

        _lastChain = chain;
        _lastSeq = seq;
        _lastRun = -1;

        // Runs that ended at the same instant (two stations) are few: look through them.
        for (var i = _position; i < _ticks.Count && _ticks[i] == endedTicks; i++)
        {
            if (_seqs[i] == seq && _chains[i] == chain)
            {
                _lastRun = i;
                break;
            }
        }

        return _lastRun;
    }
}
