using System.Globalization;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Logging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// The soak after a settle: the minimum soak, then each unit's output (in °C) until it stops drifting. A unit that
/// does not follow the block within the soak timeout errors (it is likely not seated in its well); the others go on.
/// </summary>
internal static class SoakRunner
{
    /// <summary>Soaks the batch's units; returns how long the soak took, seconds.</summary>
    public static async Task<double> SoakAsync(StepContext context, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var sequence = context.Sequence;
        var soak = sequence.Soak;
        var start = instruments.Now;
        if (soak.MinimumSeconds > 0)
        {
            await instruments.DelayAsync(soak.MinimumSeconds, ct).ConfigureAwait(false);
        }

        // Drift is judged in °C: volts from the meter over the output sensitivity, or raw counts from the link over
        // the raw sensitivity (the checker requires outputCountsPerC for a link soak).
        var read = SoakRead(sequence);
        var sensitivity = Math.Abs(OutputPerC(sequence));
        var windows = context.Batch.Active.ToDictionary(
            u => u,
            _ => new StabilityWindow(soak.WindowSeconds, double.PositiveInfinity, soak.MaxDriftCPerMinute));
        while (windows.Count > 0)
        {
            var elapsed = (instruments.Now - start).TotalSeconds;
            if (elapsed > soak.TimeoutSeconds)
            {
                foreach (var (unit, window) in windows)
                {
                    var drift = window.Evaluate().DriftPerMinute;
                    var reason = $"the unit in slot {unit.Slot} did not follow the block within {F(soak.TimeoutSeconds)} s"
                        + (drift is { } d ? $" (still drifting {F(d)} °C/min)" : string.Empty) + ": check the unit is seated in its well";
                    RuntimeLog.UnitFault(context.Logger, unit.Serial, unit.Slot, reason);
                    unit.Machine.Fault(reason);
                    await context.FinishAsync(unit).ConfigureAwait(false);
                }

                break;
            }

            var roundStart = instruments.Now;
            foreach (var (unit, window) in windows.ToList())
            {
                if (unit.IsFinished)
                {
                    windows.Remove(unit);
                    continue;
                }

                double output;
                try
                {
                    output = await instruments.ReadUnitAsync(unit.Slot, read, ct).ConfigureAwait(false);
                }
                catch (UnitFaultException ex)
                {
                    windows.Remove(unit);
                    await context.FaultUnitAsync(unit, ex.Message).ConfigureAwait(false);
                    continue;
                }

                window.Add((instruments.Now - start).TotalSeconds, output / sensitivity);
                if (window.Evaluate().IsStable)
                {
                    windows.Remove(unit);
                }
            }

            var spent = (instruments.Now - roundStart).TotalSeconds;
            if (windows.Count > 0 && soak.SampleIntervalSeconds > spent)
            {
                await instruments.DelayAsync(soak.SampleIntervalSeconds - spent, ct).ConfigureAwait(false);
            }
        }

        return (instruments.Now - start).TotalSeconds;
    }

    /// <summary>
    /// The soak quantity per °C, signed: raw counts per °C over the link (<c>outputCountsPerC</c>), else volts per °C
    /// (<c>outputVoltsPerC</c>, the trim's target slope, or 10 mV/°C).
    /// </summary>
    public static double OutputPerC(SequenceDefinition sequence) =>
        QuantityPerC(sequence, SoakRead(sequence))
        ?? throw new InvalidOperationException("Checked sequences soaking over the link give outputCountsPerC.");

    /// <summary>The quantity the soak reads: raw counts over the link, else meter volts.</summary>
    public static UnitRead SoakRead(SequenceDefinition sequence) => sequence.Soak.Output == UnitOutputs.Link ? UnitRead.Raw : UnitRead.MeterVolts;

    /// <summary>
    /// How much of <paramref name="read"/>'s quantity one °C of the unit's sensor makes, signed, for moving a sample to its
    /// final value: the soak's own sensitivity for the soak's quantity, 1 for a temperature the unit reports; null
    /// when the sequence does not say (raw counts without <c>outputCountsPerC</c>).
    /// </summary>
    public static double? QuantityPerC(SequenceDefinition sequence, UnitRead read) => read switch
    {
        UnitRead.Temperature => 1.0,
        UnitRead.Raw => sequence.Soak.OutputCountsPerC,
        _ => sequence.Soak.OutputVoltsPerC ?? sequence.Trim?.AnalogTarget?.SlopeVoltsPerC ?? 0.01,
    };

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
