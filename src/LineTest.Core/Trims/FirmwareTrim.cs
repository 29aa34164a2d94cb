using LineTest.Core.Calibration;

namespace LineTest.Core.Trims;

/// <summary>
/// Firmware-coefficient trim (see <see cref="FirmwareTrimSpec"/> for the unit model): fit temperature
/// against the raw reading, quantise each coefficient into its fixed-point register, predict the
/// remaining error, and check the registers read back.
/// </summary>
/// <remarks>
/// <para>Predicted error at a calibration setpoint: T_q(rᵢ) − T_refᵢ, with T_q the polynomial of the
/// dequantised coefficients; it includes the fit residual and the quantisation. At an extra checkpoint T the
/// raw reading is estimated by solving fit(r) = T (the root nearest the calibration readings), and the
/// error is T_q(r) − T: quantisation only.</para>
/// <para>Quantisation bound: |T_q(r) − fit(r)| ≤ Σ (LSBᵢ/2)·|r|ⁱ, largest at the end of the calibration
/// readings furthest from zero; reported as <see cref="FirmwareTrimResult.QuantisationBoundC"/>.</para>
/// </remarks>
public static class FirmwareTrim
{
    /// <summary>Computes the register values for one unit.</summary>
    /// <param name="spec">The firmware trim parameters from the sequence.</param>
    /// <param name="points">Calibration points; <see cref="CalibrationPoint.Output"/> is the raw reading in counts.</param>
    /// <param name="checkpoints">Extra temperatures (e.g. the verify setpoint) to predict the error at.</param>
    /// <param name="fitPoints">
    /// The points the coefficients are fitted to, when not the calibration points themselves: samples over the rated
    /// range of a sensor curve through the calibration points (<see cref="SensorCurve.Samples"/>), so that the
    /// polynomial follows the diode's curvature. The predicted errors at the calibration points still use the measured raw readings.
    /// </param>
    public static CalculationResult<FirmwareTrimResult> Compute(
        FirmwareTrimSpec spec,
        IReadOnlyList<CalibrationPoint> points,
        IReadOnlyList<TrimCheckpoint>? checkpoints = null,
        IReadOnlyList<CalibrationPoint>? fitPoints = null)
    {
        ArgumentNullException.ThrowIfNull(spec);
        ArgumentNullException.ThrowIfNull(points);
        checkpoints ??= [];

        var specProblems = spec.Check();
        if (specProblems.Count > 0)
        {
            return CalculationResult<FirmwareTrimResult>.Failure("firmware trim spec: " + string.Join("; ", specProblems));
        }

        var fitResult = CalibrationFit.TemperatureVersusOutput(fitPoints ?? points, (FitOrder)spec.Order);
        if (!fitResult.TryGetValue(out var fit))
        {
            return CalculationResult<FirmwareTrimResult>.Failure(fitResult.Reason!);
        }

        var problems = new List<string>();
        var registers = new FirmwareRegisterValue[spec.Coefficients.Count];
        for (var i = 0; i < registers.Length; i++)
        {
            var register = spec.Coefficients[i];
            var ideal = fit.Coefficients[i];
            var scaled = ideal / register.Lsb;
            if (!(Math.Abs(scaled) < TrimMath.MaxExactInteger))
            {
                return CalculationResult<FirmwareTrimResult>.Failure(
                    $"register {register.Register}: coefficient {TrimMath.Text(ideal)} needs about {TrimMath.Text(scaled)} counts, range {register.MinValue}…{register.MaxValue}");
            }

            var value = (long)TrimMath.RoundCode(scaled);
            if (value < register.MinValue || value > register.MaxValue)
            {
                problems.Add($"register {register.Register}: coefficient {TrimMath.Text(ideal)} needs {value}, range {register.MinValue}…{register.MaxValue}");
            }

            registers[i] = new FirmwareRegisterValue(register.Register, ideal, value, register.Dequantise(value), register.Lsb);
        }

        var quantised = registers.Select(r => r.Coefficient).ToArray();
        var errors = new List<PredictedError>(points.Count + checkpoints.Count);
        foreach (var point in points)
        {
            errors.Add(new PredictedError(point.Setpoint, point.ReferenceC, Evaluate(quantised, point.Output) - point.ReferenceC)
            {
                AtCalibrationPoint = true,
            });
        }

        var rawMin = (fitPoints ?? points).Min(p => p.Output);
        var rawMax = (fitPoints ?? points).Max(p => p.Output);
        foreach (var checkpoint in checkpoints)
        {
            if (RawFor(fit, checkpoint.TemperatureC, (rawMin + rawMax) / 2) is { } raw)
            {
                errors.Add(new PredictedError(checkpoint.Name, checkpoint.TemperatureC, Evaluate(quantised, raw) - checkpoint.TemperatureC));
            }
            else
            {
                problems.Add($"checkpoint '{checkpoint.Name}' at {TrimMath.Text(checkpoint.TemperatureC)} °C is beyond what the fitted curve can indicate");
            }
        }

        var rawExtreme = Math.Max(Math.Abs(rawMin), Math.Abs(rawMax));
        var bound = 0.0;
        for (var i = 0; i < registers.Length; i++)
        {
            bound += registers[i].Lsb / 2 * Math.Pow(rawExtreme, i);
        }

        return CalculationResult<FirmwareTrimResult>.Success(new FirmwareTrimResult
        {
            Spec = spec,
            Fit = fit,
            Registers = registers,
            Problems = problems,
            PredictedErrors = errors,
            QuantisationBoundC = bound,
        });
    }

    /// <summary>
    /// Compares what a unit reads back with what was written. A failure names every register that differs
    /// or is missing; success passes the written result on.
    /// </summary>
    /// <param name="written">The trim that was written.</param>
    /// <param name="readBack">Register name → sign-extended value read back (see <see cref="FirmwareCoefficientSpec.FromRegisterBits"/>).</param>
    public static CalculationResult<FirmwareTrimResult> CheckReadBack(FirmwareTrimResult written, IReadOnlyDictionary<string, long> readBack)
    {
        ArgumentNullException.ThrowIfNull(written);
        ArgumentNullException.ThrowIfNull(readBack);
        var mismatches = new List<string>();
        foreach (var register in written.Registers)
        {
            if (!readBack.TryGetValue(register.Register, out var value))
            {
                mismatches.Add($"register {register.Register} was not read back");
            }
            else if (value != register.Value)
            {
                mismatches.Add($"register {register.Register} read back {value}, {register.Value} was written");
            }
        }

        return mismatches.Count == 0
            ? CalculationResult<FirmwareTrimResult>.Success(written)
            : CalculationResult<FirmwareTrimResult>.Failure(string.Join("; ", mismatches));
    }

    /// <summary>c0 + c1·r (+ c2·r²) by Horner's rule.</summary>
    public static double Evaluate(IReadOnlyList<double> coefficients, double raw)
    {
        ArgumentNullException.ThrowIfNull(coefficients);
        var y = 0.0;
        for (var i = coefficients.Count - 1; i >= 0; i--)
        {
            y = (y * raw) + coefficients[i];
        }

        return y;
    }

    /// <summary>The raw reading r with fit(r) = T, the root nearest <paramref name="near"/>; null when none exists.</summary>
    internal static double? RawFor(PolynomialFit fit, double temperatureC, double near)
    {
        var c0 = fit.Intercept - temperatureC;
        var c1 = fit.Slope;
        var c2 = fit.Curvature;
        if (c2 == 0.0)
        {
            return c1 == 0.0 ? null : -c0 / c1;
        }

        var discriminant = (c1 * c1) - (4 * c2 * c0);
        if (discriminant < 0.0)
        {
            return null;
        }

        // Numerically stable pair of roots: q = −(c1 + sign(c1)·√D)/2, r₁ = q/c2, r₂ = c0/q.
        var q = -0.5 * (c1 + (Math.Sign(c1 == 0.0 ? 1.0 : c1) * Math.Sqrt(discriminant)));
        var first = q / c2;
        if (q == 0.0)
        {
            return first;
        }

        var second = c0 / q;
        return Math.Abs(first - near) <= Math.Abs(second - near) ? first : second;
    }
}
