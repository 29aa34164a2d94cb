namespace LineTest.Core.Decisions;

/// <summary>The predicted error of a trimmed unit at one temperature of its rated range.</summary>
/// <param name="Celsius">Temperature, °C.</param>
/// <param name="ErrorC">Predicted error (indicated − true), °C.</param>
/// <param name="StandardUncertaintyC">Its combined standard uncertainty, °C.</param>
/// <param name="EffectiveDegreesOfFreedom">Welch–Satterthwaite ν_eff (null: infinite).</param>
/// <param name="FloorC">√(u² + u_res²): the standard uncertainty with the trim's resolution, °C (what any unit is left with).</param>
public sealed record RatedRangePoint(double Celsius, double ErrorC, double StandardUncertaintyC, double? EffectiveDegreesOfFreedom, double FloorC)
{
    /// <summary>The budget behind <see cref="StandardUncertaintyC"/>, component by component.</summary>
    public UncertaintyBudget? Budget { get; init; }
}
