namespace LineTest.Core.Trims;

/// <summary>
/// Sequence parameters of a select-on-test resistor trim.
/// </summary>
/// <remarks>
/// <para>Unit model: <c>V(T) = G·u(T) + Voff</c> with <c>G = 1 + Rf/Rg</c> (non-inverting gain stage,
/// Rg at <c>gain.position</c>) and <c>Voff = Vref·Rfo/Ro</c> (offset summed after the gain stage, Ro at
/// <c>offset.position</c>); <c>u(T)</c> is the unknown, linear sensor chain. An open position gives G = 1
/// or Voff = 0.</para>
/// <para>The unit is calibrated with Rg = <c>gain.fittedOhms</c> and Ro = <c>offset.fittedOhms</c> fitted;
/// their values are taken as exact (fit precision or measured parts at calibration). The tolerance of the
/// parts chosen by the trim gives the worst-case error.</para>
/// <para>JSON: <c>{ "series": "E96", "allowPairs": true, "tolerancePercent": 1, "gain": { "position": "R7",
/// "feedbackOhms": 40200, "fittedOhms": 10000, "minOhms": 1000, "maxOhms": 100000 }, "offset": { "position": "R8",
/// "referenceVolts": 2.5, "feedbackOhms": 10000, "fittedOhms": 100000, "minOhms": 10000, "maxOhms": 1000000 },
/// "target": { "offsetVolts": 0.5, "slopeVoltsPerC": 0.01 } }</c></para>
/// </remarks>
public sealed record ResistorTrimSpec
{
    /// <summary>IEC 60063 series the parts come from: <c>E12</c>, <c>E24</c>, <c>E48</c> or <c>E96</c>.</summary>
    public required string Series { get; init; }

    /// <summary>Whether a position may take two parts in series or in parallel.</summary>
    public bool AllowPairs { get; init; }

    /// <summary>Tolerance of the fitted parts, ± percent (e.g. 1 for E96 parts).</summary>
    public required double TolerancePercent { get; init; }

    /// <summary>The gain stage.</summary>
    public required ResistorGainNetwork Gain { get; init; }

    /// <summary>The offset network.</summary>
    public required ResistorOffsetNetwork Offset { get; init; }

    /// <summary>The transfer function the trimmed unit must follow.</summary>
    public required LinearTransfer Target { get; init; }

    /// <summary>Problems that make the spec unusable, each with its JSON path; empty when the spec is sound.</summary>
    public IReadOnlyList<string> Check()
    {
        var problems = new List<string>();
        if (!ESeries.TryParse(Series, out _))
        {
            problems.Add($"series: '{Series}' is not one of E12, E24, E48, E96");
        }

        if (!(double.IsFinite(TolerancePercent) && TolerancePercent >= 0.0 && TolerancePercent < 100.0))
        {
            problems.Add("tolerancePercent: must be at least 0 and below 100");
        }

        if (Gain is null)
        {
            problems.Add("gain: missing");
        }
        else
        {
            CheckPosition("gain", Gain.Position, Gain.FittedOhms, Gain.MinOhms, Gain.MaxOhms, problems);
            if (!(Gain.FeedbackOhms > 0.0 && double.IsFinite(Gain.FeedbackOhms)))
            {
                problems.Add("gain.feedbackOhms: must be positive");
            }
        }

        if (Offset is null)
        {
            problems.Add("offset: missing");
        }
        else
        {
            CheckPosition("offset", Offset.Position, Offset.FittedOhms, Offset.MinOhms, Offset.MaxOhms, problems);
            if (!(Offset.FeedbackOhms > 0.0 && double.IsFinite(Offset.FeedbackOhms)))
            {
                problems.Add("offset.feedbackOhms: must be positive");
            }

            if (!double.IsFinite(Offset.ReferenceVolts) || Offset.ReferenceVolts == 0.0)
            {
                problems.Add("offset.referenceVolts: must be a finite number other than 0");
            }
        }

        if (Target is null)
        {
            problems.Add("target: missing");
        }
        else if (!double.IsFinite(Target.SlopeVoltsPerC) || Target.SlopeVoltsPerC == 0.0 || !double.IsFinite(Target.OffsetVolts))
        {
            problems.Add("target: slopeVoltsPerC must be a finite number other than 0 and offsetVolts finite");
        }

        return problems;
    }

    private static void CheckPosition(string path, string position, double? fitted, double min, double max, List<string> problems)
    {
        if (string.IsNullOrWhiteSpace(position))
        {
            problems.Add($"{path}.position: must name the board position, e.g. R7");
        }

        if (fitted is { } f && !(f > 0.0 && double.IsFinite(f)))
        {
            problems.Add($"{path}.fittedOhms: must be positive, or left out for an open position");
        }

        if (!(min > 0.0 && double.IsFinite(min)))
        {
            problems.Add($"{path}.minOhms: must be positive");
        }

        if (!(double.IsFinite(max) && max >= min))
        {
            problems.Add($"{path}.maxOhms: must be at least minOhms");
        }
    }
}
