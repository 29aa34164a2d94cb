using LineTest.Core.Trims;
using LineTest.Rig.Simulation;

namespace LineTest.Runtime.Batches;

/// <summary>
/// The simulated operator's hands: once a fitting prompt is confirmed, the parts go into the simulated unit in that
/// slot, each with an actual value drawn within the design's part tolerance (<see cref="SimulatedRig.FitParts"/>).
/// </summary>
public sealed class SimulatedPartFitting : IPartFitting
{
    private readonly SimulatedRig _rig;

    /// <summary>Fits parts into the units of <paramref name="rig"/>.</summary>
    public SimulatedPartFitting(SimulatedRig rig)
    {
        ArgumentNullException.ThrowIfNull(rig);
        _rig = rig;
    }

    /// <inheritdoc />
    public Task PartsFittedAsync(int slot, string serial, IReadOnlyList<ResistorChoice> parts, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(parts);
        cancellationToken.ThrowIfCancellationRequested();
        var unit = _rig.UnitIn(slot);
        if (unit is null || !string.Equals(unit.Serial, serial, StringComparison.Ordinal))
        {
            throw new InvalidOperationException($"Slot {slot} does not hold unit {serial}: the simulated operator cannot fit its parts.");
        }

        _rig.FitParts(slot, parts);
        return Task.CompletedTask;
    }
}
