using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Reads the reference and then every unit's output, round after round, so each unit's samples pair with reference
/// samples taken moments before. A unit whose link fails ends in error at once and is left out of the result.
/// </summary>
internal static class SampleRounds
{
    public static async Task<(double[] References, List<(UnitContext Unit, double[] Values)> Outputs)> TakeAsync(
        StepContext context, IReadOnlyList<UnitContext> units, UnitRead read, int samples, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var references = new double[samples];
        var outputs = units.Select(u => (Unit: u, Values: new double[samples])).ToList();
        for (var i = 0; i < samples; i++)
        {
            references[i] = await instruments.ReadReferenceAsync(ct).ConfigureAwait(false);
            foreach (var (unit, values) in outputs.ToList())
            {
                try
                {
                    values[i] = await instruments.ReadUnitAsync(unit.Slot, read, ct).ConfigureAwait(false);
                }
                catch (UnitFaultException ex)
                {
                    outputs.RemoveAll(o => o.Unit == unit);
                    await context.FaultUnitAsync(unit, ex.Message).ConfigureAwait(false);
                }
            }
        }

        return (references, outputs);
    }
}
