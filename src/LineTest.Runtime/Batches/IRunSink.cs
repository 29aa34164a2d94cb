using LineTest.Core.Results;

namespace LineTest.Runtime.Batches;

/// <summary>
/// Receives each run the moment it ends. Implementations store it durably before returning; an exception means
/// the run could not be stored, and the coordinator stops the batch safely (the station takes no new units).
/// </summary>
public interface IRunSink
{
    /// <summary>Stores a finished run.</summary>
    Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken);
}
