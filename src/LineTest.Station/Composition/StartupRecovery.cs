using LineTest.Core.Results;
using LineTest.Runtime.Batches;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Composition;

/// <summary>
/// What the station does first on every start, before it takes a unit: it sends the source to standby (the last
/// stop may have left the block hot or cold with nobody watching), then stores every run the journal shows in
/// progress as a run with verdict <c>error</c> and reason <c>interrupted</c>, with the readings it had.
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
        var recovered = await store.RecoverInterruptedAsync(ct).ConfigureAwait(false);
        foreach (var run in recovered)
        {
            LogRecovered(logger, run.Serial, run.Slot, run.Id, run.BatchId, run.Readings.Count);
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

    [LoggerMessage(EventId = 2011, Level = LogLevel.Warning, Message = "Recovered {Count} interrupted runs at start-up")]
    private static partial void LogRecoveredCount(ILogger logger, int count);
}
