using System.Globalization;

namespace LineTest.Core.Stability;

/// <summary>
/// Decides, from an <see cref="ExponentialApproachFit"/> of the readings so far, whether a predictive settle may take its
/// reading now. It takes the reading only when the fit converged, its residuals show no disturbance, the readings cover
/// at least <see cref="MinimumTimeConstantsCovered"/> time constants (earlier, the linearised uncertainty of an
/// extrapolation understates the true spread), the predicted final value lies within the allowed offset of the
/// setpoint, and its standard uncertainty is at most the sequence's limit. A disturbance or a predicted value outside
/// the band means falling back to the window; anything else means waiting for more readings.
/// </summary>
public static class PredictiveSettle
{
    /// <summary>Fewest time constants the readings must span before a prediction is taken.</summary>
    public const double MinimumTimeConstantsCovered = 1.0;

    /// <summary>Decides on <paramref name="fit"/>.</summary>
    /// <param name="fit">The fit of the readings since the setpoint was commanded.</param>
    /// <param name="spanSeconds">Time from the first to the last fitted reading, seconds.</param>
    /// <param name="setpointC">The setpoint, °C.</param>
    /// <param name="maxOffsetFromSetpointC">Largest allowed |predicted − setpoint|, °C (the window mode's own bound).</param>
    /// <param name="maxUncertaintyC">Largest allowed u(y∞), °C.</param>
    public static PredictiveSettleDecision Decide(ExponentialApproachResult fit, double spanSeconds, double setpointC, double maxOffsetFromSetpointC, double maxUncertaintyC)
    {
        ArgumentNullException.ThrowIfNull(fit);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(maxOffsetFromSetpointC);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(maxUncertaintyC);
        if (!fit.Converged)
        {
            return new(PredictiveSettleOutcome.KeepWaiting, $"no fit yet: {fit.Why}", fit);
        }

        if (fit.Disturbed)
        {
            return new(PredictiveSettleOutcome.FallBack, $"disturbance (residual {F(fit.ResidualRms)} °C rms, runs z {F(fit.RunsZScore)})", fit);
        }

        if (spanSeconds < MinimumTimeConstantsCovered * fit.TimeConstantSeconds)
        {
            return new(PredictiveSettleOutcome.KeepWaiting, $"readings span {F(spanSeconds)} s, less than one time constant ({F(fit.TimeConstantSeconds)} s)", fit);
        }

        // Outside the band only counts once the prediction is certain enough to say so: a wide early prediction
        // that strays outside is not yet evidence that the source will settle elsewhere.
        var offset = Math.Abs(fit.FinalValue - setpointC);
        if (fit.FinalValueStandardUncertainty > maxUncertaintyC)
        {
            return new(PredictiveSettleOutcome.KeepWaiting, $"u(y∞) {F(fit.FinalValueStandardUncertainty)} °C above the limit {F(maxUncertaintyC)} °C", fit);
        }

        if (offset > maxOffsetFromSetpointC)
        {
            return new(PredictiveSettleOutcome.FallBack, $"predicted {F(fit.FinalValue)} °C, more than {F(maxOffsetFromSetpointC)} °C from the setpoint", fit);
        }

        return new(PredictiveSettleOutcome.Take, "predictive", fit);
    }

    private static string F(double value) => value.ToString("0.####", CultureInfo.InvariantCulture);
}
