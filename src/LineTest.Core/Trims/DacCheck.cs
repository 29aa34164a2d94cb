namespace LineTest.Core.Trims;

/// <summary>
/// Closes the loop on a DAC trim: the unit's real DACs do not step by exactly their declared amounts (a DAC's reference
/// has a tolerance), so after the codes are written the station compares how far the output really moved with how far
/// the model says it should have, and takes the difference out with the offset DAC.
/// </summary>
/// <remarks>
/// <para>The check is differential and needs no reference temperature: at one settled temperature the output is read
/// with the calibration codes (g0, o0) and with the new codes (g, o) in alternation (A B B A …), so a slow drift of the
/// unit (its last bit of soak lag) cancels. The model gives the new output from the old one:
/// V_B = r·(V_A − O(o0)) + O(o), with r = G(g)/G(g0). The residual ΔV = mean(V_B) − that prediction is the error of the
/// real DAC steps at this temperature: O's step error times (o − o0), and G's step error times (g − g0) times the
/// amplified sensor signal. The codes are then chosen again with ΔV added to every prediction (with a code search, see
/// <see cref="DacCodeSearch"/>, which keeps the result within a fraction of an offset step; without one, round(ΔV/s_o)
/// offset codes are subtracted, to within half an offset step). The gain part's slope error (a few 10⁻⁵ of the span)
/// remains; moving a code or two more changes the real output by the declared steps to within the step error of that
/// small move.</para>
/// <para>A residual beyond <see cref="MaxStepErrorFraction"/> of the two DACs' moves (plus two offset steps) is not a step error — a
/// DAC that did not move, or a unit that is not what the model describes — and is left alone for the verify step to
/// judge.</para>
/// </remarks>
public static class DacCheck
{
    /// <summary>Largest step error of a DAC the check corrects, as a fraction of its whole move (2 %).</summary>
    public const double MaxStepErrorFraction = 0.02;

    /// <summary>The residual and the offset adjustment for a written trim.</summary>
    /// <param name="trim">The computed trim (its codes are the ones written).</param>
    /// <param name="meanOldVolts">Mean output with the calibration codes, volts.</param>
    /// <param name="meanNewVolts">Mean output with the new codes, volts (read at the same temperature, interleaved).</param>
    /// <param name="chooseAgain">
    /// Chooses the codes again with a measured output error (volts) added to every prediction; null subtracts whole offset
    /// steps instead.
    /// </param>
    public static DacCheckResult Evaluate(DacTrimResult trim, double meanOldVolts, double meanNewVolts, Func<double, (long GainCode, long OffsetCode)>? chooseAgain = null)
    {
        ArgumentNullException.ThrowIfNull(trim);
        var spec = trim.Spec;
        var offsetBefore = DacTrim.OffsetVolts(spec.Offset, trim.OffsetCodeAtCalibration);
        var predicted = (trim.GainRatio * (meanOldVolts - offsetBefore)) + trim.OffsetVolts;
        var residual = meanNewVolts - predicted;
        var residualC = residual / spec.Target.SlopeVoltsPerC;
        // Each DAC's step error acts on its own move, which can be large while the net change is small.
        var move = Math.Abs(trim.OffsetVolts - offsetBefore) + Math.Abs((trim.GainRatio - 1) * (meanOldVolts - offsetBefore));
        var plausible = double.IsFinite(residual) && Math.Abs(residual) <= (MaxStepErrorFraction * move) + (2 * Math.Abs(spec.Offset.Step));
        if (!plausible)
        {
            return new DacCheckResult(residual, residualC, trim.GainCode, trim.OffsetCode, false);
        }

        var (gain, offset) = chooseAgain is null
            ? (trim.GainCode, trim.OffsetCode - (long)TrimMath.RoundCode(residual / spec.Offset.Step))
            : chooseAgain(residual);
        return gain < spec.Gain.Min || gain > spec.Gain.Max || offset < spec.Offset.Min || offset > spec.Offset.Max
            ? new DacCheckResult(residual, residualC, trim.GainCode, trim.OffsetCode, false)
            : new DacCheckResult(residual, residualC, gain, offset, true);
    }
}
