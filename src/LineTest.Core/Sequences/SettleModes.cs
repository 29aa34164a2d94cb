namespace LineTest.Core.Sequences;

/// <summary>The words a <c>settle.mode</c> accepts.</summary>
public static class SettleModes
{
    /// <summary>Wait until the reference is inside its band and flat over a full window, and each unit has soaked (the default).</summary>
    public const string Window = "window";

    /// <summary>
    /// Fit the first-order approach of the reference and of each unit while they approach the setpoint and take the
    /// reading once the extrapolated final value is certain enough; fall back to <see cref="Window"/> when the fit does
    /// not converge, shows a disturbance or predicts a value outside the band.
    /// </summary>
    public const string Predictive = "predictive";

    /// <summary>Every accepted word.</summary>
    public static IReadOnlyList<string> All { get; } = [Window, Predictive];
}
