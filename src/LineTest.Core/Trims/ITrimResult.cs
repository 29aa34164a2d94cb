using LineTest.Core.Calibration;
using LineTest.Core.Results;

namespace LineTest.Core.Trims;

/// <summary>What every trim method returns: the fit, the trim, its range check and predictions.</summary>
public interface ITrimResult
{
    /// <summary><c>dac</c>, <c>resistor</c> or <c>firmware</c> (the <see cref="TrimRecord.Method"/> word).</summary>
    string Method { get; }

    /// <summary>The calibration fit the trim was computed from.</summary>
    PolynomialFit Fit { get; }

    /// <summary>False when the trim needed is outside what the product allows; see <see cref="Problems"/>.</summary>
    bool InRange { get; }

    /// <summary>Plain-language reasons the trim cannot be applied; empty when <see cref="InRange"/>.</summary>
    IReadOnlyList<string> Problems { get; }

    /// <summary>The predicted remaining error at each calibration setpoint and each extra checkpoint.</summary>
    IReadOnlyList<PredictedError> PredictedErrors { get; }

    /// <summary>
    /// The temperature the trimmed unit indicates, °C, where its output at calibration (before the trim: volts or raw
    /// counts) was <paramref name="outputAtCalibration"/>; with the rounded codes, chosen parts or quantised coefficients.
    /// </summary>
    double IndicatedC(double outputAtCalibration);

    /// <summary>The record stored with the run.</summary>
    TrimRecord ToRecord();
}
