using LineTest.Core.Results;
using LineTest.Core.Units;

namespace LineTest.Runtime.Batches;

/// <summary>An observer that ignores everything.</summary>
public sealed class NullBatchObserver : IBatchObserver
{
    /// <summary>The shared instance.</summary>
    public static NullBatchObserver Instance { get; } = new();

    /// <inheritdoc />
    public void UnitChanged(int slot, string serial, UnitState state, string step, int stepIndex, int stepCount)
    {
    }

    /// <inheritdoc />
    public void UnitFinished(RunRecord run)
    {
    }

    /// <inheritdoc />
    public void SourceChanged(double? setpointC, double? referenceC, string phase)
    {
    }
}
