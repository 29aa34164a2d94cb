using LineTest.Core.Results;
using LineTest.Core.Units;

namespace LineTest.Runtime.Batches;

/// <summary>Live progress of a batch, for the operator screen. Calls come from the coordinator's loop; keep them quick.</summary>
public interface IBatchObserver
{
    /// <summary>A unit changed state or step.</summary>
    void UnitChanged(int slot, string serial, UnitState state, string step, int stepIndex, int stepCount);

    /// <summary>A unit's run ended.</summary>
    void UnitFinished(RunRecord run);

    /// <summary>The source's setpoint or reference temperature changed.</summary>
    void SourceChanged(double? setpointC, double? referenceC, string phase);
}
