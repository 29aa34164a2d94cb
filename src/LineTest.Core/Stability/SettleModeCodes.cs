namespace LineTest.Core.Stability;

/// <summary>
/// How a setpoint was actually settled, as stored in the reading <c>settle.&lt;setpoint&gt;.mode</c>: the value is the
/// code (unit <c>1</c>), the note the word and, for a fallback, the reason. Only setpoints whose settle mode is
/// <c>predictive</c> record it; a window-mode setpoint settles as it always did.
/// </summary>
public static class SettleModeCodes
{
    /// <summary>The reading's name at <paramref name="setpoint"/>: <c>settle.&lt;setpoint&gt;.mode</c>.</summary>
    public static string ModeReading(string setpoint) => $"settle.{setpoint}.mode";

    /// <summary>
    /// The reading with the residual RMS of the approach fit at <paramref name="setpoint"/>, °C: the unit's own fit
    /// (<c>settle.&lt;setpoint&gt;.residual</c>); the reference's fit is <see cref="ReferenceResidualReading"/>.
    /// </summary>
    public static string ResidualReading(string setpoint) => $"settle.{setpoint}.residual";

    /// <summary>The residual RMS of the reference's approach fit at <paramref name="setpoint"/>, °C.</summary>
    public static string ReferenceResidualReading(string setpoint) => $"settle.{setpoint}.referenceResidual";

    /// <summary>Code 1: the reading was taken from the extrapolated final values (predictive).</summary>
    public const int Predictive = 1;

    /// <summary>Code 2: predictive mode fell back to the stability window and the soak; the note says why.</summary>
    public const int WindowFallback = 2;

    /// <summary>The word stored in the note for <paramref name="code"/>.</summary>
    public static string Word(int code) => code switch
    {
        Predictive => "predictive",
        WindowFallback => "window-fallback",
        _ => throw new ArgumentOutOfRangeException(nameof(code), code, "Not a settle mode code."),
    };
}
