namespace LineTest.Core.Stability;

/// <summary>One decision of <see cref="PredictiveSettle"/>.</summary>
/// <param name="Outcome">Take, keep waiting or fall back.</param>
/// <param name="Why">Plain words, recorded as the setpoint's settle mode reason when the station falls back.</param>
/// <param name="Fit">The fit the decision is based on.</param>
public sealed record PredictiveSettleDecision(PredictiveSettleOutcome Outcome, string Why, ExponentialApproachResult Fit);
