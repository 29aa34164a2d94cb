using LineTest.Core.Results;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Tests.Batches;

public sealed class RunJournalWriterTests
{
    [Fact]
    public async Task RunAsync_SinkWithJournal_JournalsAtStartAndAfterStepsWithTheRunIdsThatAreStored()
    {
        var sink = new JournalSink();
        var h = new CoordinatorHarness(sink: sink);
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        await h.RunAsync(units);

        // Batch start, then once after each of the sequence's steps.
        Assert.Equal(1 + h.Sequence.Steps.Count, sink.Snapshots.Count);
        Assert.All(sink.Snapshots[0], s => Assert.Empty(s.Readings));
        var journalled = sink.Snapshots.SelectMany(s => s).Select(s => s.Id).ToHashSet();
        Assert.Equal(journalled.Order(), sink.Runs.Select(r => r.Id).Order());

        // Readings only grow from one snapshot to the next.
        var counts = sink.Snapshots.Select(s => s.Sum(r => r.Readings.Count)).ToList();
        Assert.Equal(counts.Order(), counts);
        Assert.True(counts[^1] > 0);
    }

    [Fact]
    public async Task RunAsync_JournalFails_BatchStopsWithStorageExceptionAndSourceToStandby()
    {
        var sink = new JournalSink { FailAfter = 3 };
        var h = new CoordinatorHarness(sink: sink);
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        await Assert.ThrowsAsync<RunStorageException>(() => h.RunAsync(units));

        Assert.Equal(h.Fixture.Source.StandbyC, h.Rig.Block.SetpointC);
    }

    private sealed class JournalSink : IRunSink, IRunJournal
    {
        public List<RunRecord> Runs { get; } = [];

        public List<IReadOnlyList<RunRecord>> Snapshots { get; } = [];

        public int? FailAfter { get; init; }

        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken)
        {
            Runs.Add(run);
            return Task.CompletedTask;
        }

        public Task RunsInProgressAsync(IReadOnlyList<RunRecord> inProgress, CancellationToken cancellationToken)
        {
            if (Snapshots.Count == FailAfter)
            {
                throw new IOException("disk full (simulated)");
            }

            Snapshots.Add(inProgress);
            return Task.CompletedTask;
        }
    }
}
