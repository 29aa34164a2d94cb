using LineTest.Core.Calibration;
using LineTest.Core.Results;

namespace LineTest.Core.Trims;

/// <summary>The firmware coefficients computed for one unit: register values, range check and predicted error.</summary>
public sealed record FirmwareTrimResult : ITrimResult
{
    /// <summary>The spec the trim was computed for.</summary>
    public required FirmwareTrimSpec Spec { get; init; }

    /// <summary>The fit T = c0 + c1·r (+ c2·r²), temperature against raw reading.</summary>
    public required PolynomialFit Fit { get; init; }

    /// <summary>One entry per coefficient, c0 first: what to write, and what the firmware will use.</summary>
    public required IReadOnlyList<FirmwareRegisterValue> Registers { get; init; }

    /// <inheritdoc />
    public required IReadOnlyList<string> Problems { get; init; }

    /// <inheritdoc />
    public required IReadOnlyList<PredictedError> PredictedErrors { get; init; }

    /// <summary>Largest |T_q(r) − fit(r)| quantisation can cause over the calibration readings, °C.</summary>
    public required double QuantisationBoundC { get; init; }

    /// <inheritdoc />
    public string Method => "firmware";

    /// <inheritdoc />
    public bool InRange => Problems.Count == 0;

    /// <summary>The temperature the trimmed firmware will report for a raw reading.</summary>
    public double IndicatedC(double raw) => FirmwareTrim.Evaluate(Registers.Select(r => r.Coefficient).ToArray(), raw);

    /// <summary>
    /// The record stored with the run. Values: each register's integer value under its register name, and the
    /// coefficient the firmware will use as <c>coefficient.c0</c>, <c>coefficient.c1</c> (, <c>coefficient.c2</c>).
    /// </summary>
    public TrimRecord ToRecord()
    {
        var inputs = new Dictionary<string, double>(StringComparer.Ordinal)
        {
            ["fit.maxAbsResidualC"] = Fit.MaxAbsResidual,
            ["quantisationBoundC"] = QuantisationBoundC,
        };
        for (var i = 0; i < Fit.Coefficients.Count; i++)
        {
            inputs[$"fit.c{i}"] = Fit.Coefficients[i];
        }

        if (Fit.ResidualStandardDeviation is { } s)
        {
            inputs["fit.residualSdC"] = s;
        }

        var values = new Dictionary<string, double>(StringComparer.Ordinal);
        for (var i = 0; i < Registers.Count; i++)
        {
            values[Registers[i].Register] = Registers[i].Value;
            values[$"coefficient.c{i}"] = Registers[i].Coefficient;
        }

        return new TrimRecord(Method, inputs, values, TrimMath.ToDictionary(PredictedErrors), InRange, []);
    }
}
