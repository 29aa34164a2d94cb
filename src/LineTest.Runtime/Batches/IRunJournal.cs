using LineTest.Core.Results;

namespace LineTest.Runtime.Batches;

/// <summary>
/// Keeps what each unit under test has measured so far durably, so that a run cut short by a crash or a power cut can
/// be stored as interrupted on the next start instead of being lost. A run sink that is also a journal is given the
/// snapshots at batch start and after every step; storing the finished run must remove its entry in the same
/// transaction. An exception means the journal could not be written: the coordinator stops the batch as for a failed
/// result write.
/// </summary>
public interface IRunJournal
{
    /// <summary>Writes (or replaces) the entries of the runs still in progress.</summary>
    /// <param name="inProgress">One snapshot per unfinished run: its id, serial, slot, start, readings so far; its end is the snapshot time.</param>
    /// <param name="cancellationToken">Cancellation.</param>
    Task RunsInProgressAsync(IReadOnlyList<RunRecord> inProgress, CancellationToken cancellationToken);
}
