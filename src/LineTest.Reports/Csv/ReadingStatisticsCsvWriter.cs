using System.Globalization;
using CsvHelper;
using CsvHelper.Configuration;
using LineTest.Reports.Building;

namespace LineTest.Reports.Csv;

/// <summary>
/// Writes the per-reading statistics table as CSV (RFC 4180: comma, CRLF, quoted where needed; invariant
/// culture; round-trip numbers; an empty field where a value is not defined). Column names match the JSON keys.
/// </summary>
public static class ReadingStatisticsCsvWriter
{
    /// <summary>The columns, in order.</summary>
    public static IReadOnlyList<string> Header { get; } =
    [
        "name", "unit", "low", "high", "n", "missing", "mean", "stdevOverall", "stdevWithin",
        "cp", "cpLower95", "cpUpper95", "cpk", "cpkLower95", "cpkUpper95", "pp", "ppk",
        "ppmObserved", "ppmExpected", "adStatistic", "normalityP", "lcl", "centre", "ucl", "signals", "slotF", "slotP",
        "sequence", "covers", "nonNormal", "ppPercentile", "ppkPercentile", "withinDf", "signalRules", "skippedRows",
    ];

    private static readonly CsvConfiguration Rfc4180 = new(CultureInfo.InvariantCulture) { NewLine = "\r\n", Delimiter = ",", Quote = '"' };

    /// <summary>Writes the table to <paramref name="writer"/>.</summary>
    public static void Write(QualityReport report, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(writer);
        using var csv = new CsvWriter(writer, Rfc4180, leaveOpen: true);
        foreach (var column in Header)
        {
            csv.WriteField(column);
        }

        csv.NextRecord();
        for (var i = 0; i < report.Readings.Count; i++)
        {
            var r = report.Readings[i];
            var c = r.Capability;
            var slots = report.Slots[i].Result;
            string?[] fields =
            [
                r.Name, r.Unit, N(r.Low), N(r.High), r.Count.ToString(CultureInfo.InvariantCulture),
                r.Missing.ToString(CultureInfo.InvariantCulture), N(c.Mean), N(c.StdDevOverall), N(c.StdDevWithin),
                N(c.Cp), N(c.CpInterval?.Lower), N(c.CpInterval?.Upper), N(c.Cpk), N(c.CpkInterval?.Lower), N(c.CpkInterval?.Upper),
                N(c.Pp), N(c.Ppk), N(c.ObservedPpmTotal), N(c.ExpectedPpmTotal), N(r.Normality?.AStarSquared), N(r.Normality?.PValue),
                N(r.Chart?.LowerControlLimit), N(r.Chart?.Centre), N(r.Chart?.UpperControlLimit),
                r.Chart is { } chart ? SignalLabels.Summary(chart.Signals, "=") : string.Empty,
                N(slots?.FStatistic), N(slots?.PValue),
                r.SequenceId, r.Covers, r.NonNormal ? "true" : "false", N(r.Percentile?.Pp), N(r.Percentile?.Ppk), N(c.WithinDegreesOfFreedom),
                Legend(r), report.SkippedRows.Count.ToString(CultureInfo.InvariantCulture),
            ];
            foreach (var field in fields)
            {
                csv.WriteField(field ?? string.Empty);
            }

            csv.NextRecord();
        }

        csv.Flush();
    }

    /// <summary>The meaning of each signal code in this row's signals column (the legend, row by row).</summary>
    private static string Legend(ReadingStatistics r)
    {
        if (r.Chart is not { Signals.Count: > 0 } chart)
        {
            return string.Empty;
        }

        var codes = chart.Signals.Select(SignalLabels.Label).ToHashSet(StringComparer.Ordinal);
        return string.Join("; ", SignalLabels.Legend.Where(l => codes.Contains(l.Label)).Select(l => $"{l.Label}: {l.Rule}"));
    }

    private static string N(double? value) =>
        value is { } v && double.IsFinite(v) ? v.ToString("R", CultureInfo.InvariantCulture) : string.Empty;
}
