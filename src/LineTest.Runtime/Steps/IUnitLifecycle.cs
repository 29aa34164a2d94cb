using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Steps;

/// <summary>The part of a unit's lifecycle that steps hand back to the coordinator: showing its state, and ending its run.</summary>
internal interface IUnitLifecycle
{
    /// <summary>Shows the unit's present state and step to the observer.</summary>
    void Notify(BatchState batch, UnitContext unit);

    /// <summary>Ends the unit's run in the state its machine is in: the run is stored before this returns.</summary>
    Task FinishAsync(BatchState batch, UnitContext unit);
}
