namespace LineTest.Core.Stability;

/// <summary>
/// Follows one approach (the reference, or one unit) reading by reading and says when a predictive settle may take its
/// reading: it fits the readings of the last <see cref="FitSpanSeconds"/> (so the ramp before the first-order tail drops
/// out of the fit) and decides with <see cref="PredictiveSettle.Decide"/>. Misfit before any usable fit means the
/// readings are not yet a first-order approach (still ramping): keep waiting. Misfit after a usable fit is a
/// disturbance (a door opened, a unit inserted late): fall back, and stay fallen back for this setpoint. Not thread-safe;
/// one tracker per approach.
/// </summary>
public sealed class PredictiveSettleTracker
{
    private readonly Queue<(double Seconds, double Value)> _readings = new();
    private readonly double _setpointC;
    private readonly double _maxOffsetFromSetpointC;
    private readonly double _maxUncertaintyC;
    private readonly ExponentialFitOptions _options;
    private bool _sawUsableFit;

    /// <summary>Creates a tracker.</summary>
    /// <param name="setpointC">The setpoint, °C.</param>
    /// <param name="maxOffsetFromSetpointC">Largest allowed |predicted − setpoint|, °C.</param>
    /// <param name="maxUncertaintyC">Largest allowed u(y∞), °C.</param>
    /// <param name="fitSpanSeconds">How far back the fit reaches, seconds; at least a time constant of the approach.</param>
    /// <param name="options">Fit settings; defaults when null.</param>
    public PredictiveSettleTracker(double setpointC, double maxOffsetFromSetpointC, double maxUncertaintyC, double fitSpanSeconds, ExponentialFitOptions? options = null)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(maxOffsetFromSetpointC);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(maxUncertaintyC);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(fitSpanSeconds);
        _setpointC = setpointC;
        _maxOffsetFromSetpointC = maxOffsetFromSetpointC;
        _maxUncertaintyC = maxUncertaintyC;
        FitSpanSeconds = fitSpanSeconds;
        _options = options ?? ExponentialFitOptions.Default;
    }

    /// <summary>How far back the fit reaches, seconds.</summary>
    public double FitSpanSeconds { get; }

    /// <summary>The latest decision, null before the first reading.</summary>
    public PredictiveSettleDecision? Last { get; private set; }

    /// <summary>Time of the first reading of the latest fit, seconds (the fit's t = 0); NaN before the first reading.</summary>
    public double FitOriginSeconds { get; private set; } = double.NaN;

    /// <summary>True once the tracker has fallen back; it then stays so.</summary>
    public bool FellBack => Last?.Outcome == PredictiveSettleOutcome.FallBack;

    /// <summary>Adds a reading (time-ordered seconds, value) and decides again with a first-order fit.</summary>
    public PredictiveSettleDecision Add(double seconds, double value) => Fit(seconds, value, null);

    /// <summary>
    /// Adds a reading of a follower of a leader's approach (a unit following the block) and decides again with a
    /// <see cref="FollowerApproachFit"/> on the leader's fitted time constant; with no usable leader fit yet
    /// (<paramref name="leader"/> null) it keeps waiting.
    /// </summary>
    public PredictiveSettleDecision AddFollowing(double seconds, double value, ExponentialApproachResult? leader)
    {
        if (leader is { IsUsable: true })
        {
            return Fit(seconds, value, leader);
        }

        if (FellBack)
        {
            return Last!;
        }

        Enqueue(seconds, value);
        var waiting = ExponentialApproachResult.NotConverged(_readings.Count, "the leader's approach is not fitted yet");
        Last = new PredictiveSettleDecision(PredictiveSettleOutcome.KeepWaiting, "no fit yet: the reference's approach is not fitted yet", waiting);
        return Last;
    }

    private void Enqueue(double seconds, double value)
    {
        _readings.Enqueue((seconds, value));
        while (_readings.Count > FollowerApproachFit.MinimumReadings && seconds - _readings.Peek().Seconds > FitSpanSeconds)
        {
            _readings.Dequeue();
        }
    }

    private PredictiveSettleDecision Fit(double seconds, double value, ExponentialApproachResult? leader)
    {
        if (FellBack)
        {
            return Last!;
        }

        Enqueue(seconds, value);
        var readings = _readings.ToArray();
        FitOriginSeconds = readings[0].Seconds;
        var fit = leader is null
            ? ExponentialApproachFit.Fit(readings, _options)
            : FollowerApproachFit.Fit(readings, leader.TimeConstantSeconds, leader.TimeConstantStandardUncertainty, _options);
        var span = readings[^1].Seconds - readings[0].Seconds;
        var decision = PredictiveSettle.Decide(fit, span, _setpointC, _maxOffsetFromSetpointC, _maxUncertaintyC);
        if (decision.Outcome == PredictiveSettleOutcome.FallBack && fit.Disturbed && !_sawUsableFit)
        {
            decision = decision with { Outcome = PredictiveSettleOutcome.KeepWaiting, Why = $"not yet a first-order approach ({decision.Why})" };
        }

        // Only a fit over at least the covered time constants establishes the approach: an early fit over a short
        // stretch (the end of the ramp) can look usable and then stop fitting without any disturbance.
        _sawUsableFit |= fit.IsUsable && span >= PredictiveSettle.MinimumTimeConstantsCovered * fit.TimeConstantSeconds;
        Last = decision;
        return decision;
    }

    /// <summary>
    /// The latest fit's value at <paramref name="seconds"/> (same time origin as <see cref="Add"/>, see
    /// <see cref="ExponentialApproachResult.ValueAt"/>). NaN when the latest fit did not converge.
    /// </summary>
    public double PredictedAt(double seconds)
    {
        if (Last?.Fit is not { Converged: true } fit)
        {
            return double.NaN;
        }

        return fit.ValueAt(seconds - FitOriginSeconds);
    }
}
