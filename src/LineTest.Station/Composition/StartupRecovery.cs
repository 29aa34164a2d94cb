using LineTest.Core.Results;
using LineTest.Runtime.Batches;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Composition;

/// <summary>
/// What the station does first on every start, before it takes a unit: it sends the source to standby (the last
/// stop may have left the block hot or cold with nobody watching), then stores every run the journal shows in
/// progress as a run with verdict <c>error</c> and reason <c>interrupted</c>, with the readings it had. Recovery can stop at
/// any point and run again: each entry is stored and removed in one transaction, and an entry whose run is already stored
/// is only removed (logged). The caller holds the results folder's writer lock, so no other station's live runs are
/// taken for interrupted ones.
/// </summary>
public static partial class StartupRecovery
{
    /// <summary>Sends the source to standby and stores the interrupted runs. Returns them (empty after a clean stop).</summary>
    /// <param name="coordinator">The coordinator of the fixture, for the standby command.</param>
    /// <param name="store">The results store (its journal of runs in progress).</param>
    /// <param name="logger">Where the recovery is logged.</param>
    /// <param name="ct">Cancellation.</param>
    /// <exception cref="Storage.Store.ResultStoreException">An interrupted run could not be stored.</exception>
    public static async Task<IReadOnlyList<RunRecord>> RunAsync(BatchCoordinator coordinator, SqliteResultStore store, ILogger logger, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(coordinator);
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(logger);
        await coordinator.StandbyAsync("station starting").ConfigureAwait(false);
        var recovery = await store.RecoverAsync(ct).ConfigureAwait(false);
        foreach (var entry in recovery.Removed)
        {
            LogAlreadyStored(logger, entry.Id, entry.Serial, entry.Slot);
        }

        var recovered = recovery.Stored;
        foreach (var run in recovered)
        {
            if (run.Reason == SqliteResultStore.InterruptedReason)
            {
                LogRecovered(logger, run.Serial, run.Slot, run.Id, run.BatchId, run.Readings.Count);
            }
            else
            {
                LogJournalDoubt(logger, run.Id, run.Serial, run.Slot, run.Reason ?? string.Empty);
            }
        }

        foreach (var aside in store.HeadsSetAside)
        {
            LogHeadSetAside(logger, aside);
        }

        if (recovered.Count > 0)
        {
            LogRecoveredCount(logger, recovered.Count);
        }

        return recovered;
    }

    /// <summary>The line shown to the operator after a recovery.</summary>
    public static string Message(int count) =>
        $"Recovered {count} run{(count == 1 ? string.Empty : "s")} interrupted by the last stop: stored as error (interrupted) with the readings taken; retest those units.";

    [LoggerMessage(EventId = 2010, Level = LogLevel.Warning, Message = "Run {RunId} of {Serial} (slot {Slot}, batch {BatchId}) was interrupted by the last stop; stored as error with its {ReadingCount} readings")]
    private static partial void LogRecovered(ILogger logger, string serial, int slot, Guid runId, string? batchId, int readingCount);

    [LoggerMessage(EventId = 2040, Level = LogLevel.Warning, Message = "Journal entry of run {RunId} ({Serial}, slot {Slot}) removed at start-up: that run is already stored, so it was not stored again")]
    private static partial void LogAlreadyStored(ILogger logger, string runId, string serial, long slot);

    [LoggerMessage(EventId = 2041, Level = LogLevel.Error, Message = "Run {RunId} of {Serial} (slot {Slot}) stored from the journal as error ({Reason}): the journal entry was not a run, or the head did not prove the station wrote it; run 'linetest verify'")]
    private static partial void LogJournalDoubt(ILogger logger, Guid runId, string serial, int slot, string reason);

    [LoggerMessage(EventId = 2042, Level = LogLevel.Error, Message = "The results database did not match its head at start-up (changed, rolled back or restored outside LineTest); the old head was kept as {Path}; run 'linetest verify'")]
    private static partial void LogHeadSetAside(ILogger logger, string path);

    [LoggerMessage(EventId = 2011, Level = LogLevel.Warning, Message = "Recovered {Count} interrupted runs at start-up")]
    private static partial void LogRecoveredCount(ILogger logger, int count);
}
