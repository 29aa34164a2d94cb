using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Runtime.Batches;

namespace LineTest.Station.Composition;

/// <summary>
/// One composition of a station: a fixture, its instruments, the coordinator that drives them and the sink that stores
/// every run. The only place the coordinator's constructor is written; <c>run</c>, <c>demo</c>, <c>bench</c>,
/// <c>campaign</c> and <c>dry-run</c> all build their coordinator here (simulated ones through
/// <see cref="SimulatedStation"/>).
/// </summary>
public static class StationComposition
{
    /// <summary>The coordinator of <paramref name="fixture"/>'s <paramref name="instruments"/>.</summary>
    /// <param name="fixture">The fixture (wiring, safe range, standby, reference sensor).</param>
    /// <param name="instruments">Its instruments: real, simulated, or simulated behind a wrapper.</param>
    /// <param name="clock">Clock of every wait (virtual or scaled for the simulator, the system clock for real instruments).</param>
    /// <param name="sink">Stores each run the moment it ends (<see cref="StoreSink"/> over the result store).</param>
    /// <param name="parts">Operator, observer, logger, pacing and part fitting; defaults for a simulated run when null.</param>
    public static BatchCoordinator Coordinator(
        FixtureDefinition fixture, RigInstruments instruments, TimeProvider clock, IRunSink sink, CoordinatorParts? parts = null)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        parts ??= new CoordinatorParts();
        return new BatchCoordinator(
            instruments,
            fixture,
            ReferenceConversion.ToCelsius(ReferenceConversion.SensorOf(fixture)),
            clock,
            sink,
            parts.Operator,
            parts.Observer,
            parts.Logger,
            parts.Timing,
            parts.PartFitting);
    }
}
