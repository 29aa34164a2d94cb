using LineTest.Core.Calibration;

namespace LineTest.Core.Trims;

/// <summary>
/// Gain-and-offset DAC trim (see <see cref="DacTrimSpec"/> for the unit model).
/// </summary>
/// <remarks>
/// <para>The unit was calibrated carrying codes (g0, o0); a straight line V = a + b·T is fitted to its
/// output. Since V = G(g0)·u(T) + O(o0), the sensor chain is u(T) = (a − O(o0) + b·T) / G(g0) and, with
/// codes (g, o), the output becomes V(T) = r·(a − O(o0) + b·T) + O(o) with r = G(g)/G(g0).</para>
/// <para>Gain: the slope r·b must equal the target slope S, so r = S/b and
/// g* = N_g + ((1 + s_g·(g0 − N_g))·S/b − 1)/s_g, rounded half away from zero.</para>
/// <para>Offset, with the rounded gain code: O(o) = V0 − r·(a − O(o0)), o* = N_o + O(o)/s_o, rounded.</para>
/// <para>With objective temperatures (<c>objectiveC</c>) the two codes are then chosen together
/// (<see cref="DacCodeSearch"/>): the whole-code pair whose predicted error over those temperatures has the smallest
/// largest magnitude, which is never worse there than the independently rounded pair.</para>
/// <para>Predicted error at T: (V(T) − (V0 + S·T))/S in °C, using the rounded codes. At calibration
/// setpoints the measured output replaces a + b·T, so non-linearity shows in the prediction; at extra
/// checkpoints the fitted line is used.</para>
/// </remarks>
public static class DacTrim
{
    /// <summary>The message for a sensor whose fitted slope has the wrong sign.</summary>
    public const string WrongSlopeReason = "sensor slope has the wrong sign — open or reversed sensor?";

    private const double FlatSlopeFraction = 1e-9;

    /// <summary>
    /// Computes the gain and offset codes for one unit.
    /// </summary>
    /// <param name="spec">The DAC trim parameters from the sequence.</param>
    /// <param name="points">Calibration points, output in volts, measured with codes (g0, o0) in the unit.</param>
    /// <param name="gainCodeAtCalibration">g0, the gain code in the unit while it was measured.</param>
    /// <param name="offsetCodeAtCalibration">o0, the offset code in the unit while it was measured.</param>
    /// <param name="checkpoints">Extra temperatures (e.g. the verify setpoint) to predict the error at.</param>
    /// <param name="line">
    /// The line of the unit's output the trim maps onto the target, and its modelled output at the checkpoints; null for
    /// the least-squares line through the points (the <c>through-points</c> fit).
    /// </param>
    /// <param name="objectiveC">
    /// Temperatures over which to choose the codes together, °C (the rated range for a <c>minimax</c> fit, the points for
    /// <c>through-points</c>); null or empty rounds each code on its own.
    /// </param>
    /// <returns>
    /// A result (which may be out of range, with reasons), or a failure when no trim can be computed:
    /// bad spec, too few or degenerate points, or a fitted slope of the wrong sign.
    /// </returns>
    public static CalculationResult<DacTrimResult> Compute(
        DacTrimSpec spec,
        IReadOnlyList<CalibrationPoint> points,
        long gainCodeAtCalibration,
        long offsetCodeAtCalibration,
        IReadOnlyList<TrimCheckpoint>? checkpoints = null,
        TrimLine? line = null,
        IReadOnlyList<double>? objectiveC = null)
    {
        ArgumentNullException.ThrowIfNull(spec);
        ArgumentNullException.ThrowIfNull(points);
        checkpoints ??= [];

        var specProblems = spec.Check();
        if (specProblems.Count > 0)
        {
            return CalculationResult<DacTrimResult>.Failure("DAC trim spec: " + string.Join("; ", specProblems));
        }

        var fitResult = CalibrationFit.OutputVersusTemperature(points, FitOrder.Linear);
        if (!fitResult.TryGetValue(out var fit))
        {
            return CalculationResult<DacTrimResult>.Failure(fitResult.Reason!);
        }

        // Without a line of its own the trim maps the least-squares line through the points.
        line ??= new TrimLine(fit.Intercept, fit.Slope, fit.Evaluate);
        var a = line.Intercept;
        var b = line.Slope;
        var s = spec.Target.SlopeVoltsPerC;
        var v0 = spec.Target.OffsetVolts;

        // The target slope fixes the sign the sensor chain must have; zero or opposite means the
        // sensor is open, shorted or wired backwards, and no gain code can fix it. A slope below 10⁻⁹ of
        // the target is zero within the rounding of the fit (a flat output), not a weak sensor.
        if (!(b * s > 0.0) || Math.Abs(b) <= FlatSlopeFraction * Math.Abs(s))
        {
            return CalculationResult<DacTrimResult>.Failure(WrongSlopeReason);
        }

        var gainFactorAtCalibration = GainFactor(spec.Gain, gainCodeAtCalibration);
        if (!(gainFactorAtCalibration > 0.0))
        {
            return CalculationResult<DacTrimResult>.Failure(
                $"gain code {gainCodeAtCalibration} at calibration gives a gain factor of {TrimMath.Text(gainFactorAtCalibration)}; it must be positive");
        }

        var offsetAtCalibration = OffsetVolts(spec.Offset, offsetCodeAtCalibration);

        var idealGainCode = spec.Gain.Nominal + (((gainFactorAtCalibration * s / b) - 1.0) / spec.Gain.Step);
        if (!(Math.Abs(idealGainCode) < TrimMath.MaxExactInteger))
        {
            return CalculationResult<DacTrimResult>.Failure(
                $"gain code of about {TrimMath.Text(idealGainCode)} needed, range {spec.Gain.Min}…{spec.Gain.Max}");
        }

        var gainCode = (long)TrimMath.RoundCode(idealGainCode);
        var problems = new List<string>();
        var gainFactor = GainFactor(spec.Gain, gainCode);
        var ratio = gainFactor / gainFactorAtCalibration;

        var offsetNeededVolts = v0 - (ratio * (a - offsetAtCalibration));
        var idealOffsetCode = spec.Offset.Nominal + (offsetNeededVolts / spec.Offset.Step);
        if (!(Math.Abs(idealOffsetCode) < TrimMath.MaxExactInteger))
        {
            return CalculationResult<DacTrimResult>.Failure(
                $"offset code of about {TrimMath.Text(idealOffsetCode)} needed, range {spec.Offset.Min}…{spec.Offset.Max}");
        }

        var offsetCode = (long)TrimMath.RoundCode(idealOffsetCode);
        if (objectiveC is { Count: > 0 })
        {
            var outputs = objectiveC.Select(t => line.OutputAt(t)).ToArray();
            var chosen = DacCodeSearch.Choose(spec, gainFactorAtCalibration, offsetAtCalibration, objectiveC, outputs, gainCode, offsetCode);
            if (chosen.GainCode != gainCode)
            {
                gainCode = chosen.GainCode;
                gainFactor = GainFactor(spec.Gain, gainCode);
                ratio = gainFactor / gainFactorAtCalibration;
                idealOffsetCode = spec.Offset.Nominal + ((v0 - (ratio * (a - offsetAtCalibration))) / spec.Offset.Step);
            }

            offsetCode = chosen.OffsetCode;
        }

        if (gainCode < spec.Gain.Min || gainCode > spec.Gain.Max)
        {
            problems.Add($"gain code {gainCode} needed, range {spec.Gain.Min}…{spec.Gain.Max}");
        }

        if (offsetCode < spec.Offset.Min || offsetCode > spec.Offset.Max)
        {
            problems.Add($"offset code {offsetCode} needed, range {spec.Offset.Min}…{spec.Offset.Max}");
        }

        var offsetVolts = OffsetVolts(spec.Offset, offsetCode);
        var errors = new List<PredictedError>(points.Count + checkpoints.Count);
        foreach (var point in points)
        {
            var trimmed = (ratio * (point.Output - offsetAtCalibration)) + offsetVolts;
            errors.Add(new PredictedError(point.Setpoint, point.ReferenceC, ErrorC(trimmed, point.ReferenceC))
            {
                AtCalibrationPoint = true,
            });
        }

        foreach (var checkpoint in checkpoints)
        {
            var trimmed = (ratio * (line.OutputAt(checkpoint.TemperatureC) - offsetAtCalibration)) + offsetVolts;
            errors.Add(new PredictedError(checkpoint.Name, checkpoint.TemperatureC, ErrorC(trimmed, checkpoint.TemperatureC)));
        }

        return CalculationResult<DacTrimResult>.Success(new DacTrimResult
        {
            Spec = spec,
            Fit = fit,
            GainCodeAtCalibration = gainCodeAtCalibration,
            OffsetCodeAtCalibration = offsetCodeAtCalibration,
            IdealGainCode = idealGainCode,
            IdealOffsetCode = idealOffsetCode,
            GainCode = gainCode,
            OffsetCode = offsetCode,
            GainRatio = ratio,
            OffsetVolts = offsetVolts,
            Problems = problems,
            PredictedErrors = errors,
        });

        double ErrorC(double trimmedVolts, double temperatureC) => (trimmedVolts - spec.Target.VoltsAt(temperatureC)) / s;
    }

    /// <summary>G(g)/G_design = 1 + Gain.Step·(g − Gain.Nominal).</summary>
    public static double GainFactor(DacChannelSpec gain, long code)
    {
        ArgumentNullException.ThrowIfNull(gain);
        return 1.0 + (gain.Step * (code - gain.Nominal));
    }

    /// <summary>O(o) = Offset.Step·(o − Offset.Nominal), volts.</summary>
    public static double OffsetVolts(DacChannelSpec offset, long code)
    {
        ArgumentNullException.ThrowIfNull(offset);
        return offset.Step * (code - offset.Nominal);
    }
}
