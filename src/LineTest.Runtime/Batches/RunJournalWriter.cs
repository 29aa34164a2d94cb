using LineTest.Core.Results;
using LineTest.Runtime.Logging;
using Microsoft.Extensions.Logging;

namespace LineTest.Runtime.Batches;

/// <summary>
/// Hands snapshots of the runs in progress to the sink's journal (when the sink keeps one). A failed journal write is
/// a failed result write: it ends in <see cref="RunStorageException"/>, which stops the batch.
/// </summary>
internal sealed class RunJournalWriter(IRunJournal? journal, string fixtureId, TimeProvider time, ILogger logger)
{
    /// <summary>Snapshot of every unfinished unit of <paramref name="batch"/>, written in one go.</summary>
    public async Task WriteAsync(BatchState batch)
    {
        if (journal is null)
        {
            return;
        }

        var now = time.GetUtcNow();
        var snapshots = batch.Active.Select(unit => Snapshot(batch, unit, fixtureId, now)).ToList();
        if (snapshots.Count == 0)
        {
            return;
        }

        try
        {
            // Not cancellable: a cancel must still leave the journal consistent with what was measured.
            await journal.RunsInProgressAsync(snapshots, CancellationToken.None).ConfigureAwait(false);
        }
        catch (Exception ex) when (ex is not OperationCanceledException)
        {
            RuntimeLog.StoreFailed(logger, string.Join(", ", snapshots.Select(s => s.Serial)), ex.Message);
            throw new RunStorageException($"the progress of the batch could not be saved: {ex.Message}", ex);
        }
    }

    /// <summary>The run as far as it has got: verdict error until it ends (it is not finished), the readings taken so far.</summary>
    internal static RunRecord Snapshot(BatchState batch, UnitContext unit, string fixtureId, DateTimeOffset now)
    {
        var request = batch.Request;
        return new RunRecord
        {
            Id = unit.RunId,
            Serial = unit.Serial,
            Product = request.Sequence.Product,
            SequenceId = request.Sequence.Id,
            SequenceRevision = request.Sequence.Revision,
            SequenceSha256 = request.SequenceSha256,
            Station = request.Station,
            Fixture = fixtureId,
            Slot = unit.Slot,
            Operator = request.Operator,
            Lot = request.Lot,
            BatchId = batch.Id,
            Mode = request.Mode,
            StartedUtc = unit.Started,
            EndedUtc = now,
            Verdict = Verdict.Error,
            Reason = $"in progress: {unit.CurrentStep}",
            FirstFailingReading = unit.FirstFailingReading,
            Readings = unit.Readings.ToList(),
            Trim = unit.Trim,
            Setpoints = unit.Setpoints.ToList(),
            Firmware = unit.Firmware,
        };
    }
}
