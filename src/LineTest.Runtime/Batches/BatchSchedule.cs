using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Throughput;

namespace LineTest.Runtime.Batches;

/// <summary>
/// How the coordinator spends time at setpoints. <see cref="Fast"/> (the default) waits only as long as the readings
/// say it must: the source is stable when the reference has stayed in band over the window, the units have soaked
/// when their own outputs stop drifting; where the sequence marks its setpoint order free the settle blocks are
/// visited in the order with the least travel, and the first setpoint is commanded before the steps that do not need
/// a stable block (identify, supply current) so the block ramps while they run. <see cref="Baseline(SequenceDefinition, SourceDefinition)"/>
/// is the comparison: fixed waits long enough for the slowest travel, setpoints in file order, nothing overlapped
/// (and, in the bench, one unit per batch).
/// </summary>
/// <param name="Kind">Fast or baseline.</param>
/// <param name="FixedSettleSeconds">Baseline only: seconds from commanding a setpoint until it is taken as stable.</param>
/// <param name="FixedSoakSeconds">Baseline only: seconds the units soak after that.</param>
public sealed record BatchSchedule(BatchScheduleKind Kind, double FixedSettleSeconds, double FixedSoakSeconds)
{
    /// <summary>Stability and soak from readings, free order used, checks while ramping.</summary>
    public static BatchSchedule Fast { get; } = new(BatchScheduleKind.Fast, 0, 0);

    /// <summary>
    /// The baseline for <paramref name="sequence"/> on <paramref name="source"/>: settle for the slowest travel between
    /// any two of the sequence's setpoints and the standby temperature (<see cref="ThermalBound.TravelSeconds"/>) plus
    /// one stability window, then soak for the sequence's minimum soak plus one soak window — the least a fixed soak
    /// could be while still giving the units the time the sequence asks for.
    /// </summary>
    public static BatchSchedule Baseline(SequenceDefinition sequence, SourceDefinition source)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(source);
        var temperatures = sequence.Setpoints.Select(s => s.Celsius).Append(source.StandbyC).ToList();
        var slowest = temperatures.SelectMany(from => temperatures.Select(to => ThermalBound.TravelSeconds(source, from, to, sequence.Stability.BandC))).Max();
        return new BatchSchedule(
            BatchScheduleKind.Baseline,
            Math.Ceiling(slowest + sequence.Stability.WindowSeconds),
            Math.Max(sequence.Soak.MinimumSeconds, 0) + sequence.Soak.WindowSeconds);
    }
}
