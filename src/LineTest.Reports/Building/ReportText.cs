using System.Globalization;

namespace LineTest.Reports.Building;

/// <summary>Wording and number formats that every report format shares, so console, CSV, JSON and HTML say the same.</summary>
public static class ReportText
{
    /// <summary>The flag printed beside a reading that fails the normality test.</summary>
    public const string NonNormalMark = "!";

    /// <summary>
    /// How readings are named in tables: the name alone when the report covers one sequence, "name (sequence)" when it
    /// covers several, so two products' figures are never mistaken for one.
    /// </summary>
    public static Func<ReadingStatistics, string> Labeller(QualityReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var several = report.Readings.Select(r => r.SequenceId).Distinct().Count() > 1;
        return r => several && r.SequenceId is { } id ? $"{r.Name} ({id})" : r.Name;
    }

    /// <summary>
    /// One format for every value of a reading (mean, σ, limits, group means): fixed decimals that show its overall σ
    /// to about 3 significant digits, so a column does not mix 2.49, 2.4901 and 2.5. G5 where σ is not known or the
    /// numbers are too large or small for fixed decimals.
    /// </summary>
    public static Func<double?, string> ValueFormat(ReadingStatistics reading)
    {
        ArgumentNullException.ThrowIfNull(reading);
        var c = reading.Capability;
        if (c.StdDevOverall is not { } sd || !(sd > 1e-9) || Math.Abs(c.Mean ?? 0) > 1e9 || sd > 1e9)
        {
            return NumberText.Value;
        }

        var decimals = Math.Clamp(2 - (int)Math.Floor(Math.Log10(sd)), 0, 9);
        var format = "F" + decimals.ToString(CultureInfo.InvariantCulture);
        return v => v is { } x && double.IsFinite(x) ? x.ToString(format, CultureInfo.InvariantCulture) : NumberText.NotDefined;
    }

    /// <summary>Notes under the capability table: which readings are not normal and what to read instead.</summary>
    public static IEnumerable<string> CapabilityNotes(QualityReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var label = Labeller(report);
        var nonNormal = report.Readings.Where(r => r.HasLimits && r.NonNormal).ToList();
        if (nonNormal.Count > 0)
        {
            yield return $"{NonNormalMark} Not normal (Anderson–Darling p < 0.05): {string.Join(", ", nonNormal.Select(label))}. Their Cp, Cpk, Pp, Ppk and "
                + "expected ppm assume a normal distribution and are not to be trusted; read Ppk pct (percentile method, ISO 22514-2).";
        }

        var thin = report.Readings.Where(r => r.Percentile is { ExtremesInterpolated: true }).ToList();
        if (thin.Count > 0)
        {
            yield return $"Ppk pct from fewer than 741 values ({string.Join(", ", thin.Select(label))}): the 0.135 % and 99.865 % points lie at the sample's edge, so it reads high.";
        }

        yield return "Cp and Cpk bounds use σ within (moving range) with its effective degrees of freedom, about 0.6(n − 1); Pp and Ppk bounds use n − 1.";
    }

    /// <summary>The legend of run-rule codes, one line.</summary>
    public static string SignalLegend() =>
        "Signals: " + string.Join("; ", SignalLabels.Legend.Select(l => $"{l.Label} {l.Rule}")) + ".";
}
