using LineTest.Core.Definitions;

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

    /// <summary>Problems that make the spec unusable, each with its path relative to the spec; empty when the spec is sound.</summary>
    public IReadOnlyList<SpecProblem> Check()
    {
        var problems = new List<SpecProblem>();
        if (!ESeries.TryParse(Series, out _))
        {
            problems.Add(new("series", $"'{Series}' is not one of E12, E24, E48, E96"));
        }

        if (DefinitionBounds.TolerancePercent.Refusal(TolerancePercent) is { } tolerance)
        {
            problems.Add(new("tolerancePercent", tolerance));
        }

        if (Gain is null)
        {
            problems.Add(new("gain", "missing"));
        }
        else
        {
            CheckPosition("gain", Gain.Position, Gain.FittedOhms, Gain.MinOhms, Gain.MaxOhms, problems);
            Ohms("gain.feedbackOhms", Gain.FeedbackOhms, problems);
        }

        if (Offset is null)
        {
            problems.Add(new("offset", "missing"));
        }
        else
        {
            CheckPosition("offset", Offset.Position, Offset.FittedOhms, Offset.MinOhms, Offset.MaxOhms, problems);
            Ohms("offset.feedbackOhms", Offset.FeedbackOhms, problems);
            if (!DefinitionBounds.ReferenceVoltsMagnitude.Admits(Math.Abs(Offset.ReferenceVolts)))
            {
                problems.Add(new("offset.referenceVolts", $"must be a number other than 0, at most {NumberBound.F(DefinitionBounds.ReferenceVoltsMagnitude.Maximum)} V either way"));
            }
        }

        if (Target is null)
        {
            problems.Add(new("target", "missing"));
        }
        else
        {
            if (!double.IsFinite(Target.SlopeVoltsPerC) || Target.SlopeVoltsPerC == 0.0)
            {
                problems.Add(new("target.slopeVoltsPerC", "must be a finite number other than 0"));
            }

            if (DefinitionBounds.TransferOffsetVolts.Refusal(Target.OffsetVolts) is { } offset)
            {
                problems.Add(new("target.offsetVolts", offset));
            }
        }

        return problems;
    }

    private static void CheckPosition(string path, string position, double? fitted, double min, double max, List<SpecProblem> problems)
    {
        if (string.IsNullOrWhiteSpace(position))
        {
            problems.Add(new($"{path}.position", "must name the board position, e.g. R7"));
        }

        if (fitted is { } f)
        {
            Ohms($"{path}.fittedOhms", f, problems, " (or leave it out for an open position)");
        }

        var minOk = Ohms($"{path}.minOhms", min, problems);
        if (Ohms($"{path}.maxOhms", max, problems) && minOk && max < min)
        {
            problems.Add(new($"{path}.maxOhms", "must be at least minOhms"));
        }
    }

    private static bool Ohms(string path, double value, List<SpecProblem> problems, string hint = "")
    {
        if (DefinitionBounds.Ohms.Refusal(value) is not { } reason)
        {
            return true;
        }

        problems.Add(new(path, reason + hint));
        return false;
    }
}
