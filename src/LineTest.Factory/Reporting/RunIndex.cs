namespace LineTest.Factory.Reporting;

/// <summary>
/// The loaded runs by key (station database, seq), so readings streamed in any order find their run's index in the
/// <c>RunTable</c>. Built by one thread, then only read (from several at once).
/// </summary>
internal sealed class RunIndex
{
    private const int SeqBits = 40;
    private readonly Dictionary<Guid, long> _chains = [];
    private readonly Dictionary<long, int> _runs = [];
    private readonly List<bool>? _firstRuns;

    /// <summary>Creates an empty index; <paramref name="firstRuns"/>: keep a first-run flag per run.</summary>
    public RunIndex(bool firstRuns)
    {
        _firstRuns = firstRuns ? [] : null;
    }

    /// <summary>Per run, true when it is its unit's first run; null when not kept.</summary>
    public bool[]? FirstRunFlags => _firstRuns?.ToArray();

    /// <summary>Number of runs.</summary>
    public int Count => _runs.Count;

    /// <summary>Adds the next run, whose index is the number of runs added before it.</summary>
    public void Add(Guid chain, long seq, bool firstRun)
    {
        if (!_chains.TryGetValue(chain, out var number))
        {
            number = _chains.Count;
            _chains.Add(chain, number);
        }

        if (seq < 0 || seq >= 1L << SeqBits)
        {
            throw new InvalidDataException($"Run seq {seq} of station database {chain} is outside 0…2^{SeqBits}.");
        }

        _runs.Add((number << SeqBits) | seq, _runs.Count);
        _firstRuns?.Add(firstRun);
    }

    /// <summary>The index of run (<paramref name="chain"/>, <paramref name="seq"/>), or -1 when it was not loaded.</summary>
    public int Find(Guid chain, long seq) => Find(ChainNumber(chain), seq);

    /// <summary>The number of station database <paramref name="chain"/> in this index, -1 when none of its runs was loaded.</summary>
    public long ChainNumber(Guid chain) => _chains.TryGetValue(chain, out var number) ? number : -1;

    /// <summary>The index of run <paramref name="seq"/> of the station database numbered <paramref name="chainNumber"/>, or -1.</summary>
    public int Find(long chainNumber, long seq) =>
        chainNumber >= 0 && seq >= 0 && seq < 1L << SeqBits && _runs.TryGetValue((chainNumber << SeqBits) | seq, out var run) ? run : -1;
}
