using LineTest.Core.Calibration;
using LineTest.Core.Results;

namespace LineTest.Core.Trims;

/// <summary>The gain and offset codes computed for one unit, with their range check and predicted error.</summary>
public sealed record DacTrimResult : ITrimResult
{
    /// <summary>The spec the trim was computed for.</summary>
    public required DacTrimSpec Spec { get; init; }

    /// <inheritdoc />
    public required PolynomialFit Fit { get; init; }

    /// <summary>g0: the gain code in the unit during calibration.</summary>
    public required long GainCodeAtCalibration { get; init; }

    /// <summary>o0: the offset code in the unit during calibration.</summary>
    public required long OffsetCodeAtCalibration { get; init; }

    /// <summary>g* before rounding.</summary>
    public required double IdealGainCode { get; init; }

    /// <summary>o* before rounding (computed with the gain code written).</summary>
    public required double IdealOffsetCode { get; init; }

    /// <summary>The gain code to write (rounded half away from zero, or chosen together with the offset code; not clamped).</summary>
    public required long GainCode { get; init; }

    /// <summary>The offset code to write (rounded half away from zero, or chosen together with the gain code; not clamped).</summary>
    public required long OffsetCode { get; init; }

    /// <summary>G(g)/G(g0) with the rounded gain code.</summary>
    public required double GainRatio { get; init; }

    /// <summary>O(o) with the rounded offset code, volts.</summary>
    public required double OffsetVolts { get; init; }

    /// <inheritdoc />
    public required IReadOnlyList<string> Problems { get; init; }

    /// <inheritdoc />
    public required IReadOnlyList<PredictedError> PredictedErrors { get; init; }

    /// <inheritdoc />
    public string Method => "dac";

    /// <inheritdoc />
    public bool InRange => Problems.Count == 0;

    /// <summary>Register name → code to write over the unit link, gain first.</summary>
    public IReadOnlyList<KeyValuePair<string, long>> Registers =>
    [
        new(Spec.Gain.Register, GainCode),
        new(Spec.Offset.Register, OffsetCode),
    ];

    /// <inheritdoc />
    public double IndicatedC(double outputAtCalibration) =>
        Spec.Target.IndicatedC((GainRatio * (outputAtCalibration - DacTrim.OffsetVolts(Spec.Offset, OffsetCodeAtCalibration))) + OffsetVolts);

    /// <inheritdoc/>
    public TrimRecord ToRecord()
    {
        var inputs = new Dictionary<string, double>(StringComparer.Ordinal)
        {
            ["fit.offsetVolts"] = Fit.Intercept,
            ["fit.slopeVoltsPerC"] = Fit.Slope,
            ["fit.maxAbsResidualVolts"] = Fit.MaxAbsResidual,
            ["gainCodeBefore"] = GainCodeAtCalibration,
            ["offsetCodeBefore"] = OffsetCodeAtCalibration,
            ["idealGainCode"] = IdealGainCode,
            ["idealOffsetCode"] = IdealOffsetCode,
        };
        if (Fit.ResidualStandardDeviation is { } s)
        {
            inputs["fit.residualSdVolts"] = s;
        }

        var values = new Dictionary<string, double>(StringComparer.Ordinal)
        {
            ["gainCode"] = GainCode,
            ["offsetCode"] = OffsetCode,
        };
        return new TrimRecord(Method, inputs, values, TrimMath.ToDictionary(PredictedErrors), InRange, []);
    }
}
