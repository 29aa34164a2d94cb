using LineTest.Core.Results;
using LineTest.Runtime.Batches;

namespace LineTest.Station.Campaign;

/// <summary>Keeps finished runs in memory (fuzzing needs verdicts, not a database).</summary>
internal sealed class CollectingSink : IRunSink
{
    public List<RunRecord> Runs { get; } = [];

    public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken)
    {
        Runs.Add(run);
        return Task.CompletedTask;
    }
}
