namespace LineTest.Runtime.Batches;

/// <summary>How a batch waits at its setpoints.</summary>
public enum BatchScheduleKind
{
    /// <summary>Stability and soak judged from readings; free setpoint order used; identify and supply checks while the block ramps.</summary>
    Fast,

    /// <summary>Fixed settle and soak times, setpoints in file order: the comparison schedule of a traditional station.</summary>
    Baseline,
}
