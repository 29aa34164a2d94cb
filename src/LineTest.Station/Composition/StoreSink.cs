using LineTest.Core.Results;
using LineTest.Runtime.Batches;
using LineTest.Storage.Store;

namespace LineTest.Station.Composition;

/// <summary>
/// Writes each finished run to the result store before the coordinator moves on, and keeps the store's journal of
/// runs in progress up to date after every step.
/// </summary>
public sealed class StoreSink : IRunSink, IRunJournal
{
    private readonly IResultStore _store;
    private readonly Action<RunRecord>? _afterStore;

    /// <summary>Creates a sink over <paramref name="store"/>; <paramref name="afterStore"/> sees each run once it is durable.</summary>
    public StoreSink(IResultStore store, Action<RunRecord>? afterStore = null)
    {
        ArgumentNullException.ThrowIfNull(store);
        _store = store;
        _afterStore = afterStore;
    }

    /// <inheritdoc />
    public async Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken)
    {
        await _store.AppendAsync(run, cancellationToken).ConfigureAwait(false);
        _afterStore?.Invoke(run);
    }

    /// <inheritdoc />
    public Task RunsInProgressAsync(IReadOnlyList<RunRecord> inProgress, CancellationToken cancellationToken) =>
        _store.JournalAsync(inProgress, cancellationToken);
}
