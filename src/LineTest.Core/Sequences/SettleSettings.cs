namespace LineTest.Core.Sequences;

/// <summary>
/// How the station decides the source and the units have settled at a setpoint: <c>"settle": { "mode": "predictive",
/// "maxExtrapolationUncertaintyC": 0.01 }</c>, per sequence and optionally per setpoint (a setpoint's own settings
/// replace the sequence's). Absent: window mode.
/// </summary>
public sealed record SettleSettings
{
    /// <summary>
    /// <c>window</c> (the default) or <c>predictive</c>, see <see cref="SettleModes"/>. In predictive mode the station fits
    /// the approach of the reference and of each unit while the source settles, takes its readings at the extrapolated
    /// final values once they are certain enough, and falls back to window mode (recording why) when it cannot.
    /// </summary>
    public string Mode { get; init; } = SettleModes.Window;

    /// <summary>
    /// Predictive mode: the largest standard uncertainty of the extrapolated final value, °C, at which the reading may
    /// be taken. Required in predictive mode and smaller than the stability band. The fit's own u(y∞) enters each
    /// reading's uncertainty budget as its own component, so guard bands widen by it.
    /// </summary>
    public double? MaxExtrapolationUncertaintyC { get; init; }

    /// <summary>The settings in force at <paramref name="setpointName"/>: the setpoint's own, else the sequence's, else window mode.</summary>
    public static SettleSettings For(SequenceDefinition sequence, string setpointName)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        var own = sequence.Setpoints.FirstOrDefault(s => string.Equals(s.Name, setpointName, StringComparison.Ordinal))?.Settle;
        return own ?? sequence.Settle ?? new SettleSettings();
    }

    /// <summary>
    /// <paramref name="sequence"/> with <paramref name="settle"/> in force at every setpoint: the sequence's own settings
    /// replaced and every setpoint's own settings removed (null: window mode everywhere).
    /// </summary>
    public static SequenceDefinition ForAll(SequenceDefinition sequence, SettleSettings? settle)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        return sequence with { Settle = settle, Setpoints = sequence.Setpoints.Select(s => s with { Settle = null }).ToList() };
    }
}
