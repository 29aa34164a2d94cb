using LineTest.Core.Calibration;

namespace LineTest.Core.Trims;

/// <summary>
/// Select-on-test resistor trim (see <see cref="ResistorTrimSpec"/> for the unit model).
/// </summary>
/// <remarks>
/// <para>With Rg0, Ro0 fitted at calibration, G0 = 1 + Rf/Rg0 and Voff0 = Vref·Rfo/Ro0, the fitted line
/// a + b·T gives u(T) = (a − Voff0 + b·T)/G0, so with new parts V(T) = (G/G0)·(a − Voff0 + b·T) + Voff.</para>
/// <para>Gain: G* = G0·S/b, Rg* = Rf/(G* − 1); the nearest series value (or pair) is chosen.
/// Offset, with the chosen Rg: Voff* = V0 − (G/G0)·(a − Voff0), Ro* = Vref·Rfo/Voff*; then its part(s).</para>
/// <para>Predicted error at T: (V(T) − (V0 + S·T))/S °C with the chosen nominal values; the measured output
/// is used at calibration setpoints, the fitted line at extra checkpoints. The worst case takes every part
/// of both positions to ±tolerance (every corner: the error is monotonic in each part) and keeps the
/// largest |error|.</para>
/// <para>A failure value is returned when no part could do it (a gain below 1, an offset of the sign Vref
/// cannot give, a sensor slope of the wrong sign); a result with <see cref="ITrimResult.InRange"/> false when
/// the value needed lies outside the position's allowed range.</para>
/// </remarks>
public static class ResistorTrim
{
    /// <summary>Computes the parts to fit for one unit.</summary>
    /// <param name="spec">The resistor trim parameters from the sequence.</param>
    /// <param name="points">Calibration points, output in volts, measured with the spec's fitted parts.</param>
    /// <param name="checkpoints">Extra temperatures (e.g. the verify setpoint) to predict the error at.</param>
    /// <param name="line">
    /// The line of the unit's output the trim maps onto the target, and its modelled output at the checkpoints; null for
    /// the least-squares line through the points (the <c>through-points</c> fit).
    /// </param>
    public static CalculationResult<ResistorTrimResult> Compute(
        ResistorTrimSpec spec,
        IReadOnlyList<CalibrationPoint> points,
        IReadOnlyList<TrimCheckpoint>? checkpoints = null,
        TrimLine? line = null)
    {
        ArgumentNullException.ThrowIfNull(spec);
        ArgumentNullException.ThrowIfNull(points);
        checkpoints ??= [];

        var specProblems = spec.Check();
        if (specProblems.Count > 0)
        {
            return CalculationResult<ResistorTrimResult>.Failure("resistor trim spec: " + string.Join("; ", specProblems));
        }

        if (!ESeries.TryParse(spec.Series, out var series))
        {
            throw new InvalidOperationException("Unreachable: Check() accepted the series name.");
        }

        var fitResult = CalibrationFit.OutputVersusTemperature(points, FitOrder.Linear);
        if (!fitResult.TryGetValue(out var fit))
        {
            return CalculationResult<ResistorTrimResult>.Failure(fitResult.Reason!);
        }

        // Without a line of its own the trim maps the least-squares line through the points.
        line ??= new TrimLine(fit.Intercept, fit.Slope, fit.Evaluate);
        var a = line.Intercept;
        var b = line.Slope;
        var s = spec.Target.SlopeVoltsPerC;
        var v0 = spec.Target.OffsetVolts;
        if (!(b * s > 0.0) || Math.Abs(b) <= 1e-9 * Math.Abs(s))
        {
            return CalculationResult<ResistorTrimResult>.Failure(DacTrim.WrongSlopeReason);
        }

        var gain = spec.Gain;
        var offset = spec.Offset;
        var gainAtCalibration = gain.GainWith(gain.FittedOhms);
        var offsetAtCalibration = offset.OffsetVoltsWith(offset.FittedOhms);

        var idealGain = gainAtCalibration * s / b;
        if (!(idealGain > 1.0))
        {
            return CalculationResult<ResistorTrimResult>.Failure(
                $"a gain of {TrimMath.Text(idealGain)} is needed, but the stage at {gain.Position} cannot go below 1");
        }

        var problems = new List<string>();
        var idealRg = gain.FeedbackOhms / (idealGain - 1.0);
        if (!double.IsFinite(idealRg))
        {
            return CalculationResult<ResistorTrimResult>.Failure(
                $"{gain.Position}: a gain of {TrimMath.Text(idealGain)} cannot be set with Rf = {ResistanceText.Format(gain.FeedbackOhms)}");
        }

        CheckRange(gain.Position, idealRg, gain.MinOhms, gain.MaxOhms, problems);
        var gainChoice = ResistorSelector.Choose(gain.Position, idealRg, series, spec.AllowPairs, gain.MinOhms, gain.MaxOhms);

        var ratio = gain.GainWith(gainChoice.EffectiveOhms) / gainAtCalibration;
        var idealOffsetVolts = v0 - (ratio * (a - offsetAtCalibration));
        if (!(idealOffsetVolts * offset.ReferenceVolts > 0.0))
        {
            return CalculationResult<ResistorTrimResult>.Failure(
                $"an offset of {TrimMath.Text(idealOffsetVolts)} V is needed at {offset.Position}, but the network only adds offsets of the sign of Vref ({TrimMath.Text(offset.ReferenceVolts)} V)");
        }

        var idealRo = offset.ReferenceVolts * offset.FeedbackOhms / idealOffsetVolts;
        if (!double.IsFinite(idealRo))
        {
            return CalculationResult<ResistorTrimResult>.Failure(
                $"{offset.Position}: an offset of {TrimMath.Text(idealOffsetVolts)} V is too small to set with a resistor");
        }

        CheckRange(offset.Position, idealRo, offset.MinOhms, offset.MaxOhms, problems);
        var offsetChoice = ResistorSelector.Choose(offset.Position, idealRo, series, spec.AllowPairs, offset.MinOhms, offset.MaxOhms);

        var tolerance = spec.TolerancePercent / 100.0;
        var corners = Corners(gainChoice, offsetChoice, tolerance);
        var errors = new List<PredictedError>(points.Count + checkpoints.Count);
        foreach (var point in points)
        {
            errors.Add(Predict(point.Setpoint, point.ReferenceC, point.Output, atCalibration: true));
        }

        foreach (var checkpoint in checkpoints)
        {
            errors.Add(Predict(checkpoint.Name, checkpoint.TemperatureC, line.OutputAt(checkpoint.TemperatureC), atCalibration: false));
        }

        return CalculationResult<ResistorTrimResult>.Success(new ResistorTrimResult
        {
            Spec = spec,
            Fit = fit,
            GainAtCalibration = gainAtCalibration,
            OffsetVoltsAtCalibration = offsetAtCalibration,
            IdealGain = idealGain,
            IdealOffsetVolts = idealOffsetVolts,
            Gain = gainChoice,
            Offset = offsetChoice,
            Problems = problems,
            PredictedErrors = errors,
        });

        PredictedError Predict(string name, double temperatureC, double outputAtCalibration, bool atCalibration)
        {
            var nominal = ErrorC(gainChoice.EffectiveOhms, offsetChoice.EffectiveOhms);
            var worst = Math.Abs(nominal);
            foreach (var (rg, ro) in corners)
            {
                worst = Math.Max(worst, Math.Abs(ErrorC(rg, ro)));
            }

            return new PredictedError(name, temperatureC, nominal) { WorstCaseErrorC = worst, AtCalibrationPoint = atCalibration };

            double ErrorC(double rgOhms, double roOhms)
            {
                var trimmed = (gain.GainWith(rgOhms) / gainAtCalibration * (outputAtCalibration - offsetAtCalibration))
                    + offset.OffsetVoltsWith(roOhms);
                return (trimmed - spec.Target.VoltsAt(temperatureC)) / s;
            }
        }
    }

    /// <summary>Effective (Rg, Ro) at every combination of each part at −tolerance and +tolerance.</summary>
    internal static IReadOnlyList<(double RgOhms, double RoOhms)> Corners(ResistorChoice gain, ResistorChoice offset, double tolerance)
    {
        var gainValues = PartCorners(gain, tolerance);
        var offsetValues = PartCorners(offset, tolerance);
        return gainValues.SelectMany(rg => offsetValues.Select(ro => (rg, ro))).ToArray();
    }

    private static List<double> PartCorners(ResistorChoice choice, double tolerance)
    {
        var values = new List<double>();
        var count = choice.Parts.Count;
        for (var mask = 0; mask < (1 << count); mask++)
        {
            var parts = new double[count];
            for (var i = 0; i < count; i++)
            {
                parts[i] = choice.Parts[i] * (((mask >> i) & 1) == 1 ? 1.0 + tolerance : 1.0 - tolerance);
            }

            values.Add(ResistorChoice.Combine(choice.Connection, parts));
        }

        return values;
    }

    private static void CheckRange(string position, double idealOhms, double minOhms, double maxOhms, List<string> problems)
    {
        if (idealOhms < minOhms || idealOhms > maxOhms)
        {
            problems.Add(
                $"{position} of {ResistanceText.Format(idealOhms)} needed, range {ResistanceText.Format(minOhms)}…{ResistanceText.Format(maxOhms)}");
        }
    }
}
