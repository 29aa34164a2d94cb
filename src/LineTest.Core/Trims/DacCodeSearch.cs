namespace LineTest.Core.Trims;

/// <summary>
/// Chooses a DAC trim's gain and offset codes together: the pair of whole codes whose predicted error, over a set of
/// temperatures, has the smallest largest magnitude — instead of rounding the gain code and then the offset code each
/// on its own.
/// </summary>
/// <remarks>
/// <para>One gain code moves the output by G·s_g·u(T) (about 50 µV for a CTP-40A, a tenth of an offset step), so a gain
/// code a few steps from the ideal one, with the offset code re-rounded for it, can land the output much closer to the
/// target than the nearest pair: the codes form a lattice, and the best point of the lattice is not the rounded ideal
/// point. The cost is a small tilt (s_g of the slope per code), which the search weighs against the offset it saves.
/// This is the minimax objective applied to the quantised codes themselves (the same criterion as
/// <see cref="Calibration.MinimaxLine"/>, restricted to what the DACs can be set to).</para>
/// <para>For each gain code within <see cref="GainCodeWindow"/> of the rounded ideal one, the offset that centres the
/// predicted error's range is rounded down and up; every candidate's largest |error| over the temperatures is computed
/// and the smallest wins (ties: the gain code nearer the ideal, then the lower offset code). The independently rounded
/// pair is always a candidate, so the result is never worse than it over the temperatures given.</para>
/// </remarks>
public static class DacCodeSearch
{
    /// <summary>Gain codes tried on each side of the rounded ideal gain code.</summary>
    public const int GainCodeWindow = 12;

    /// <summary>
    /// The best code pair, the largest |predicted error| it leaves over <paramref name="temperaturesC"/>, °C, and the
    /// same for the independently rounded pair.
    /// </summary>
    /// <param name="spec">The DAC trim parameters.</param>
    /// <param name="gainFactorAtCalibration">G(g0)/G_design while the unit was measured.</param>
    /// <param name="offsetAtCalibration">O(o0) while the unit was measured, volts.</param>
    /// <param name="temperaturesC">Where the error is judged, °C (at least one).</param>
    /// <param name="untrimmedOutput">The unit's modelled output with the calibration codes at each temperature, volts.</param>
    /// <param name="roundedGainCode">The independently rounded gain code.</param>
    /// <param name="roundedOffsetCode">The independently rounded offset code for it.</param>
    /// <param name="outputShiftVolts">
    /// A measured error of the real output against the model, added to every prediction (from <see cref="DacCheck"/>), volts.
    /// </param>
    public static (long GainCode, long OffsetCode, double MaxAbsErrorC, double RoundedMaxAbsErrorC) Choose(
        DacTrimSpec spec,
        double gainFactorAtCalibration,
        double offsetAtCalibration,
        IReadOnlyList<double> temperaturesC,
        IReadOnlyList<double> untrimmedOutput,
        long roundedGainCode,
        long roundedOffsetCode,
        double outputShiftVolts = 0)
    {
        ArgumentNullException.ThrowIfNull(spec);
        ArgumentNullException.ThrowIfNull(temperaturesC);
        ArgumentNullException.ThrowIfNull(untrimmedOutput);
        if (temperaturesC.Count == 0 || temperaturesC.Count != untrimmedOutput.Count)
        {
            throw new ArgumentException("One output per temperature, and at least one temperature, are needed.", nameof(untrimmedOutput));
        }

        var s = spec.Target.SlopeVoltsPerC;
        var d = new double[temperaturesC.Count];
        Residuals(roundedGainCode);
        var roundedError = MaxAbsError(roundedOffsetCode);
        var best = (Gain: roundedGainCode, Offset: roundedOffsetCode, Error: roundedError);
        for (var g = roundedGainCode - GainCodeWindow; g <= roundedGainCode + GainCodeWindow; g++)
        {
            if (g < spec.Gain.Min || g > spec.Gain.Max)
            {
                continue;
            }

            // The error without offset, then the offset that centres its range, in codes.
            Residuals(g);
            var centre = (d.Max() + d.Min()) / 2;
            var idealOffsetCode = spec.Offset.Nominal - (centre * s / spec.Offset.Step);
            if (!(Math.Abs(idealOffsetCode) < TrimMath.MaxExactInteger))
            {
                continue;
            }

            foreach (var o in new[] { (long)Math.Floor(idealOffsetCode), (long)Math.Ceiling(idealOffsetCode) })
            {
                if (o < spec.Offset.Min || o > spec.Offset.Max)
                {
                    continue;
                }

                var error = MaxAbsError(o);
                if (error < best.Error
                    || (error == best.Error && (Math.Abs(g - roundedGainCode) < Math.Abs(best.Gain - roundedGainCode)
                        || (Math.Abs(g - roundedGainCode) == Math.Abs(best.Gain - roundedGainCode) && o < best.Offset))))
                {
                    best = (g, o, error);
                }
            }
        }

        return (best.Gain, best.Offset, best.Error, roundedError);

        // d(T) = (trimmed output without the offset DAC − target)/S, °C.
        void Residuals(long gainCode)
        {
            var ratio = DacTrim.GainFactor(spec.Gain, gainCode) / gainFactorAtCalibration;
            for (var i = 0; i < d.Length; i++)
            {
                d[i] = ((ratio * (untrimmedOutput[i] - offsetAtCalibration)) + outputShiftVolts - spec.Target.VoltsAt(temperaturesC[i])) / s;
            }
        }

        // The largest |error| with the offset code added to the residuals d[] of the gain code last passed to Residuals.
        double MaxAbsError(long offsetCode)
        {
            var offsetC = DacTrim.OffsetVolts(spec.Offset, offsetCode) / s;
            return d.Max(x => Math.Abs(x + offsetC));
        }
    }
}
