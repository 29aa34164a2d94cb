using System.Collections.Concurrent;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// Where the report scans put the damaged runs they skip (<c>report --skip-bad-rows</c>) instead of stopping: each run
/// by its seq with the first reason found, from the run scan and the reading scans at once (thread-safe). Without a
/// collector a damaged row stops the scan with a <see cref="Store.ResultStoreException"/> naming the run.
/// </summary>
public sealed class DamagedRuns
{
    private readonly ConcurrentDictionary<long, string> _runs = new();

    /// <summary>Number of damaged runs found.</summary>
    public int Count => _runs.Count;

    /// <summary>Records run <paramref name="seq"/> as damaged; the first reason given for a run is kept.</summary>
    public void Add(long seq, string reason) => _runs.TryAdd(seq, reason);

    /// <summary>Whether run <paramref name="seq"/> was found damaged.</summary>
    public bool Contains(long seq) => _runs.ContainsKey(seq);

    /// <summary>The damaged runs in seq order.</summary>
    public IReadOnlyList<(long Seq, string Reason)> InSeqOrder() =>
        [.. _runs.OrderBy(r => r.Key).Select(r => (r.Key, r.Value))];
}
