using LineTest.Core.Fixtures;

namespace LineTest.Rig.Simulation;

/// <summary>
/// One slot of the simulated fixture: its wiring and the unit loaded in it. The lock serialises everything that
/// touches the loaded unit (meter reads, link commands, load and unload).
/// </summary>
internal sealed class SimulatedSlot(SlotDefinition definition, SimulatedDryBlock block, TimeProvider timeProvider)
{
    // Concurrency: _unit and the unit's own state are guarded by Gate.
    private SimulatedUnit? _unit;

    public Lock Gate { get; } = new();

    public SlotDefinition Definition { get; } = definition;

    public FaultGate LinkFaults { get; } = new();

    public SimulatedUnit? Unit
    {
        get
        {
            lock (Gate)
            {
                return _unit;
            }
        }
    }

    public void Load(SimulatedUnit unit, double arrivalC)
    {
        lock (Gate)
        {
            if (_unit is not null)
            {
                throw new InvalidOperationException($"Slot {Definition.Slot} already holds unit {_unit.Serial}; unload it first.");
            }

            unit.PlaceAt(arrivalC, timeProvider.GetUtcNow());
            _unit = unit;
        }
    }

    public SimulatedUnit? Unload()
    {
        lock (Gate)
        {
            var unit = _unit;
            if (unit is not null)
            {
                // Bring the unit's sensor up to the moment it leaves, so its ground truth stays consistent.
                unit.FollowWell(block, Definition.Slot, timeProvider.GetUtcNow());
            }

            _unit = null;
            return unit;
        }
    }

    /// <summary>Under <see cref="Gate"/>: the loaded unit with its sensor brought up to now, or null.</summary>
    public SimulatedUnit? CurrentUnitLocked()
    {
        _unit?.FollowWell(block, Definition.Slot, timeProvider.GetUtcNow());
        return _unit;
    }
}
