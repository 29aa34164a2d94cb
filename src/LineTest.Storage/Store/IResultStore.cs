using LineTest.Core.Results;

namespace LineTest.Storage.Store;

/// <summary>
/// Where finished runs go. The runtime calls <see cref="AppendAsync"/> once per run, the moment the run ends.
/// </summary>
/// <remarks>
/// Failure policy: a result store is an audit destination. When a run cannot be stored durably the
/// implementation throws <see cref="ResultStoreException"/> with a plain message, and the runtime stops
/// taking new units until an operator or engineer has fixed the cause. Implementations are safe to call
/// from several threads; writes are serialised.
/// </remarks>
public interface IResultStore : IAsyncDisposable
{
    /// <summary>
    /// Stores one finished run and all its readings. When the returned task completes the run is on disk.
    /// </summary>
    /// <param name="run">The finished run.</param>
    /// <param name="ct">Cancels waiting for the writer; a write that has started is always finished.</param>
    /// <exception cref="ResultStoreException">The run could not be stored (disk full, read-only, locked, ...).</exception>
    Task AppendAsync(RunRecord run, CancellationToken ct);

    /// <summary>
    /// Writes (or replaces) the journal entries of runs still in progress, so a crash cannot lose them; storing a run
    /// with <see cref="AppendAsync"/> removes its entry in the same transaction. A store without a journal keeps nothing.
    /// </summary>
    /// <param name="inProgress">Snapshots of the unfinished runs.</param>
    /// <param name="ct">Cancels waiting for the writer.</param>
    /// <exception cref="ResultStoreException">The journal could not be written.</exception>
    Task JournalAsync(IReadOnlyList<RunRecord> inProgress, CancellationToken ct) => Task.CompletedTask;
}
