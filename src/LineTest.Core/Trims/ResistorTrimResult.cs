using LineTest.Core.Calibration;
using LineTest.Core.Results;

namespace LineTest.Core.Trims;

/// <summary>The parts chosen for one unit's select-on-test positions, with range check and predicted error.</summary>
public sealed record ResistorTrimResult : ITrimResult
{
    /// <summary>The spec the trim was computed for.</summary>
    public required ResistorTrimSpec Spec { get; init; }

    /// <inheritdoc />
    public required PolynomialFit Fit { get; init; }

    /// <summary>G0 = 1 + Rf/Rg0 during calibration.</summary>
    public required double GainAtCalibration { get; init; }

    /// <summary>Voff0 = Vref·Rfo/Ro0 during calibration, volts.</summary>
    public required double OffsetVoltsAtCalibration { get; init; }

    /// <summary>G* = G0·S/b, the exact gain wanted.</summary>
    public required double IdealGain { get; init; }

    /// <summary>Voff* with the chosen gain part, volts.</summary>
    public required double IdealOffsetVolts { get; init; }

    /// <summary>Part(s) for the gain position.</summary>
    public required ResistorChoice Gain { get; init; }

    /// <summary>Part(s) for the offset position.</summary>
    public required ResistorChoice Offset { get; init; }

    /// <inheritdoc />
    public required IReadOnlyList<string> Problems { get; init; }

    /// <inheritdoc />
    public required IReadOnlyList<PredictedError> PredictedErrors { get; init; }

    /// <inheritdoc />
    public string Method => "resistor";

    /// <inheritdoc />
    public bool InRange => Problems.Count == 0;

    /// <summary>What the operator must fit, one line per position; empty when the trim is not in range.</summary>
    public IReadOnlyList<string> Instructions => InRange ? [Gain.Instruction, Offset.Instruction] : [];

    /// <inheritdoc />
    public double IndicatedC(double outputAtCalibration) => Spec.Target.IndicatedC(
        (Spec.Gain.GainWith(Gain.EffectiveOhms) / GainAtCalibration * (outputAtCalibration - OffsetVoltsAtCalibration))
        + Spec.Offset.OffsetVoltsWith(Offset.EffectiveOhms));

    /// <summary>
    /// The record stored with the run. Values: each position's effective ohms under its name (<c>R7</c>) and,
    /// for a pair, the parts as <c>R7.1</c>, <c>R7.2</c>. Predicted errors: the nominal error under the
    /// setpoint name and the worst case over part tolerance under <c>name.worstCase</c>.
    /// </summary>
    public TrimRecord ToRecord()
    {
        var inputs = new Dictionary<string, double>(StringComparer.Ordinal)
        {
            ["fit.offsetVolts"] = Fit.Intercept,
            ["fit.slopeVoltsPerC"] = Fit.Slope,
            ["fit.maxAbsResidualVolts"] = Fit.MaxAbsResidual,
            ["gainBefore"] = GainAtCalibration,
            ["offsetVoltsBefore"] = OffsetVoltsAtCalibration,
            ["idealGain"] = IdealGain,
            ["idealOffsetVolts"] = IdealOffsetVolts,
            [$"ideal.{Gain.Position}"] = Gain.IdealOhms,
            [$"ideal.{Offset.Position}"] = Offset.IdealOhms,
        };
        if (Fit.ResidualStandardDeviation is { } s)
        {
            inputs["fit.residualSdVolts"] = s;
        }

        var values = new Dictionary<string, double>(StringComparer.Ordinal);
        AddChoice(values, Gain);
        AddChoice(values, Offset);

        var worst = PredictedErrors.Where(e => e.WorstCaseErrorC is not null)
            .Select(e => new PredictedError(e.Name + ".worstCase", e.TemperatureC, e.WorstCaseErrorC!.Value));
        return new TrimRecord(Method, inputs, values, TrimMath.ToDictionary([.. PredictedErrors, .. worst]), InRange, Instructions);
    }

    private static void AddChoice(Dictionary<string, double> values, ResistorChoice choice)
    {
        // The position's effective value under its own name; the parts of a pair as R7.1, R7.2.
        values[choice.Position] = choice.EffectiveOhms;
        if (choice.Parts.Count > 1)
        {
            for (var i = 0; i < choice.Parts.Count; i++)
            {
                values[$"{choice.Position}.{i + 1}"] = choice.Parts[i];
            }
        }
    }
}
