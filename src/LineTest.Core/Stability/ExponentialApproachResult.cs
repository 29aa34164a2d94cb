namespace LineTest.Core.Stability;

/// <summary>
/// What an <see cref="ExponentialApproachFit"/> found: y(t) = FinalValue + Amplitude·exp(−t/τ), t from the first reading;
/// or, for a <see cref="FollowerApproachFit"/> (a sensor following a leader's first-order approach with time constant
/// τ_L = <see cref="LeaderTimeConstantSeconds"/>), y(t) = FinalValue + LeaderAmplitude·exp(−t/τ_L) + Amplitude·φ(t), with
/// φ(t) = (exp(−t/τ) − exp(−t/τ_L))/(1/τ_L − 1/τ) (→ t·exp(−t/τ_L) as τ → τ_L).
/// </summary>
/// <param name="Converged">True when a minimum was found inside the searched time-constant range with a usable covariance.</param>
/// <param name="FinalValue">The extrapolated final value y∞ (NaN when not converged).</param>
/// <param name="FinalValueStandardUncertainty">u(y∞) from the fit's covariance scaled by the residual variance.</param>
/// <param name="Amplitude">A = y(0) − y∞.</param>
/// <param name="TimeConstantSeconds">τ, seconds.</param>
/// <param name="TimeConstantStandardUncertainty">u(τ), seconds.</param>
/// <param name="ResidualRms">Root mean square of the residuals.</param>
/// <param name="Readings">How many readings were fitted.</param>
/// <param name="RunsZScore">Runs-test z-score of the residual signs (strongly negative: a shape the model lacks).</param>
/// <param name="Disturbed">True when the residuals show a disturbance (runs test or size against the expected noise).</param>
/// <param name="Why">Plain words: converged, a disturbance, or why there is no fit.</param>
public sealed record ExponentialApproachResult(
    bool Converged,
    double FinalValue,
    double FinalValueStandardUncertainty,
    double Amplitude,
    double TimeConstantSeconds,
    double TimeConstantStandardUncertainty,
    double ResidualRms,
    int Readings,
    double RunsZScore,
    bool Disturbed,
    string Why)
{
    /// <summary>The leader's time constant of a follower fit, seconds; null for a plain first-order fit.</summary>
    public double? LeaderTimeConstantSeconds { get; init; }

    /// <summary>The amplitude of the leader's term of a follower fit.</summary>
    public double LeaderAmplitude { get; init; }

    /// <summary>How many parameters were fitted: three for a first-order approach (y∞, A, τ), four for a follower (and the leader's amplitude).</summary>
    public int FittedParameters => LeaderTimeConstantSeconds is null ? 3 : 4;

    /// <summary>True when the fit can be used to predict: converged and undisturbed.</summary>
    public bool IsUsable => Converged && !Disturbed;

    /// <summary>The fitted curve at <paramref name="seconds"/> after the first fitted reading; NaN when not converged.</summary>
    public double ValueAt(double seconds)
    {
        if (!Converged)
        {
            return double.NaN;
        }

        return LeaderTimeConstantSeconds is { } leader
            ? FinalValue + (LeaderAmplitude * Math.Exp(-seconds / leader)) + (Amplitude * FollowerApproachFit.Phi(seconds, TimeConstantSeconds, leader))
            : FinalValue + (Amplitude * Math.Exp(-seconds / TimeConstantSeconds));
    }

    internal static ExponentialApproachResult NotConverged(int readings, string why) =>
        new(false, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, readings, 0, false, why);
}
