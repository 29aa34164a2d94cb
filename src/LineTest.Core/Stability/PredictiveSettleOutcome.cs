namespace LineTest.Core.Stability;

/// <summary>What a predictive settle does after one more reading.</summary>
public enum PredictiveSettleOutcome
{
    /// <summary>The prediction is good enough: take the reading now, with the extrapolation's uncertainty in its budget.</summary>
    Take,

    /// <summary>No usable prediction yet (too few readings, too early on the curve, still too uncertain): keep sampling.</summary>
    KeepWaiting,

    /// <summary>The prediction must not be used at this setpoint (a disturbance, a value outside the band): wait as in window mode.</summary>
    FallBack,
}
