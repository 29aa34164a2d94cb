using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;
using LineTest.Core.Throughput;

namespace LineTest.Core.Tests.Throughput;

public sealed class ThermalBoundTests
{
    [Fact]
    public void Compute_SequenceWithIvSweeps_TimeEstimateIgnoredTheSweeps()
    {
        // The bound once counted measure and verify steps only, so a sequence with I–V sweeps looked faster than it can
        // be. [derived] The shipped DAC sequence sweeps 7 currents, 1 sample, at cal-low and cal-high: for 4 units at
        // 1 s per reference and 0.2 s per reading each sweep adds 4 × (2 × 1 + 7 × 0.2) = 13.6 s to its setpoint's leg.
        var fixture = FixtureLoader.Load(TestFiles.ShippedFixturePath, File.ReadAllBytes(TestFiles.ShippedFixturePath)).Value!;
        var sequence = SequenceLoader.Load(TestFiles.ShippedSequencePath, File.ReadAllBytes(TestFiles.ShippedSequencePath), fixture).Value!;
        var withoutSweeps = sequence with { Steps = sequence.Steps.Where(s => s is not IvSweepStep).ToList() };
        Assert.Equal(2, sequence.Steps.Count(s => s is IvSweepStep));

        var bound = ThermalBound.Compute(sequence, fixture.Source, fixture.Source.StandbyC, 4, 1.0, 0.2);
        var boundWithout = ThermalBound.Compute(withoutSweeps, fixture.Source, fixture.Source.StandbyC, 4, 1.0, 0.2);

        Assert.Equal(2 * 13.6, bound.BatchSeconds - boundWithout.BatchSeconds, 6);
    }
}
