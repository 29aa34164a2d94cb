namespace LineTest.Core.Sequences;

/// <summary>
/// How the station decides the source and the units have settled at a setpoint: <c>"settle": { "mode": "predictive",
/// "maxExtrapolationUncertaintyC": 0.01 }</c>, per sequence and optionally per setpoint (a setpoint's own settings
/// replace the sequence's). Absent: window mode.
/// </summary>
public sealed record SettleSettings
{
    /// <summary>
    /// <c>window</c> (the default) or <c>predictive</c>, see <see cref="SettleModes"/>. The station's settle wait does not
    /// act on <c>predictive</c> yet: it is checked and stored, and the station still settles as in window mode.
    /// </summary>
    public string Mode { get; init; } = SettleModes.Window;

    /// <summary>
    /// Predictive mode: the largest standard uncertainty of the extrapolated final value, °C, at which the reading may
    /// be taken. Required in predictive mode and smaller than the stability band. Meant to enter the reading's
    /// uncertainty budget as its own component (widening the guard band) once the station acts on predictive mode.
    /// </summary>
    public double? MaxExtrapolationUncertaintyC { get; init; }

    /// <summary>The settings in force at <paramref name="setpointName"/>: the setpoint's own, else the sequence's, else window mode.</summary>
    public static SettleSettings For(SequenceDefinition sequence, string setpointName)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        var own = sequence.Setpoints.FirstOrDefault(s => string.Equals(s.Name, setpointName, StringComparison.Ordinal))?.Settle;
        return own ?? sequence.Settle ?? new SettleSettings();
    }
}
