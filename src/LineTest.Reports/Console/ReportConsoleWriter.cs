using System.Globalization;
using LineTest.Reports.Building;
using LineTest.Reports.Loading;
using Spectre.Console;
using Spectre.Console.Rendering;

namespace LineTest.Reports.Console;

/// <summary>
/// Prints a report as Spectre.Console tables narrow enough for an 80-column terminal: yield, failures, then the
/// readings split over several small tables (spread, capability, control chart, slot bias) rather than one wide one.
/// </summary>
public static class ReportConsoleWriter
{
    /// <summary>Widest line of plain output: wide enough that no table has to wrap a cell.</summary>
    public const int PlainWidth = 4000;

    /// <summary>Writes the report to <paramref name="console"/>.</summary>
    public static void Write(QualityReport report, IAnsiConsole console) => Write(report, console, plain: false);

    /// <summary>
    /// Writes the report to <paramref name="console"/>; <paramref name="plain"/> for a file or a pipe: no colour, no
    /// full-width rules, and the console treated as <see cref="PlainWidth"/> columns wide so no cell is wrapped and no
    /// name or number is split across lines.
    /// </summary>
    public static void Write(QualityReport report, IAnsiConsole console, bool plain)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(console);
        if (plain)
        {
            console.Profile.Width = PlainWidth;
            console.Write(new Text(report.Title + "\n"));
        }
        else
        {
            console.Write(new Rule(Escape(report.Title)) { Justification = Justify.Left });
        }

        Line(console, $"Runs: {report.Query.Describe()}");
        foreach (var source in report.Sources)
        {
            Line(console, $"From: {source}");
        }

        Line(console, $"Made: {report.GeneratedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss", CultureInfo.InvariantCulture)} UTC");
        if (report.SkippedRows.Count > 0)
        {
            Line(console, $"Skipped {NumberText.Count(report.SkippedRows.Count)} bad input row(s) (--skip-bad-rows):");
            foreach (var row in report.SkippedRows.Take(20))
            {
                Line(console, "  " + row);
            }

            if (report.SkippedRows.Count > 20)
            {
                Line(console, $"  ... and {NumberText.Count(report.SkippedRows.Count - 20)} more (all are in the JSON report)");
            }
        }

        console.WriteLine();

        var y = report.Yield;
        var yield = NewTable("Yield", "Runs", "Units", "First pass", "Final", "Retests/unit", "Errors");
        AddRow(yield, NumberText.Count(y.Runs), NumberText.Count(y.Units), NumberText.Percent(y.FirstPassYield), NumberText.Percent(y.FinalYield), NumberText.Rate(y.RetestRate), NumberText.Percent(y.ErrorRate));
        console.Write(yield);

        if (y.FailurePareto.Count > 0)
        {
            var pareto = NewTable("Failures by reading", "Reading", "Failed runs", "Share", "Cumulative");
            foreach (var bar in y.FailurePareto)
            {
                AddRow(pareto, bar.Name, NumberText.Count(bar.Count), NumberText.Percent(bar.Fraction), NumberText.Percent(bar.CumulativeFraction));
            }

            console.Write(pareto);
        }

        if (y.ErrorReasons.Count > 0)
        {
            var errors = NewTable("Errors by reason", "Reason", "Runs");
            foreach (var bar in y.ErrorReasons)
            {
                AddRow(errors, bar.Name, NumberText.Count(bar.Count));
            }

            console.Write(errors);
        }

        if (report.Readings.Count == 0)
        {
            Line(console, "No readings match the filters.");
            return;
        }

        WriteReadings(report, console);
        WriteGroups(report, console);
    }

    private static void WriteReadings(QualityReport report, IAnsiConsole console)
    {
        var label = ReportText.Labeller(report);
        if (report.Readings.Select(r => r.SequenceId).Distinct().Count() > 1)
        {
            var covers = NewTable("Products: every figure covers one sequence", "Reading", "Covers");
            foreach (var r in report.Readings)
            {
                AddRow(covers, label(r), r.Covers);
            }

            console.Write(covers);
        }
        else if (report.Readings.Count > 0)
        {
            Line(console, $"Readings cover {report.Readings[0].Covers}.");
        }

        var spread = NewTable("Readings", "Reading", "Unit", "n", "Mean", "SD overall", "SD within", "Normal p");
        foreach (var r in report.Readings)
        {
            var c = r.Capability;
            var format = ReportText.ValueFormat(r);
            AddRow(spread, label(r), r.Unit, NumberText.Count(r.Count), format(c.Mean), format(c.StdDevOverall), format(c.StdDevWithin), NumberText.P(r.Normality?.PValue) + (r.NonNormal ? " !" : string.Empty));
        }

        console.Write(spread);

        var capability = NewTable("Capability (95 % bounds on Cpk)", "Reading", "Cp", "Cpk", "Cpk 95 %", "Pp", "Ppk", "Ppk pct", "ppm obs", "ppm exp");
        foreach (var r in report.Readings.Where(r => r.HasLimits))
        {
            var c = r.Capability;
            var bounds = c.CpkInterval is { } ci ? $"{NumberText.Index(ci.Lower)}–{NumberText.Index(ci.Upper)}" : NumberText.NotDefined;
            AddRow(capability, label(r) + (r.NonNormal ? " !" : string.Empty), NumberText.Index(c.Cp), NumberText.Index(c.Cpk), bounds, NumberText.Index(c.Pp), NumberText.Index(c.Ppk), NumberText.Index(r.Percentile?.Ppk), NumberText.Ppm(c.ObservedPpmTotal), NumberText.Ppm(c.ExpectedPpmTotal));
        }

        if (capability.Rows.Count > 0)
        {
            console.Write(capability);
            foreach (var note in ReportText.CapabilityNotes(report))
            {
                Line(console, note);
            }
        }

        var control = NewTable("Individuals chart", "Reading", "LCL", "Centre", "UCL", "Signals");
        foreach (var r in report.Readings)
        {
            if (r.Chart is { } chart)
            {
                AddRow(control, r.Name, NumberText.Value(chart.LowerControlLimit), NumberText.Value(chart.Centre), NumberText.Value(chart.UpperControlLimit), SignalLabels.Summary(chart.Signals));
            }
            else
            {
                AddRow(control, r.Name, NumberText.NotDefined, NumberText.NotDefined, NumberText.NotDefined, r.ChartNote ?? string.Empty);
            }
        }

        console.Write(control);
        Line(console, ReportText.SignalLegend());

        var slots = NewTable("Slot bias (one-way ANOVA)", "Reading", "F", "p", "Slot offsets from the mean");
        foreach (var entry in report.Slots)
        {
            if (entry.Result is { } s)
            {
                var offsets = string.Join("  ", s.Groups.Select(g => $"{g.Slot.ToString(CultureInfo.InvariantCulture)}: {NumberText.Offset(g.OffsetFromGrandMean)}"));
                AddRow(slots, entry.Name, NumberText.Value(s.FStatistic), NumberText.P(s.PValue), offsets);
            }
            else
            {
                AddRow(slots, entry.Name, NumberText.NotDefined, NumberText.NotDefined, entry.Reason ?? string.Empty);
            }
        }

        console.Write(slots);
    }

    private static void WriteGroups(QualityReport report, IAnsiConsole console)
    {
        if (report.Query.GroupBy == ReportGrouping.None)
        {
            return;
        }

        var by = report.Query.GroupBy.ToString().ToLowerInvariant();
        var label = ReportText.Labeller(report);
        var yield = NewTable($"Yield by {by}", Capitalize(by), "Runs", "Units", "First pass", "Final", "Retests/unit", "Errors");
        foreach (var g in report.Groups)
        {
            var y = g.Yield;
            AddRow(yield, g.Key, NumberText.Count(y.Runs), NumberText.Count(y.Units), NumberText.Percent(y.FirstPassYield), NumberText.Percent(y.FinalYield), NumberText.Rate(y.RetestRate), NumberText.Percent(y.ErrorRate));
        }

        console.Write(yield);
        Line(console, "A unit's runs count in the group of its first run, so the groups add up to the overall table.");

        var readings = NewTable($"Readings by {by}", Capitalize(by), "Reading", "n", "Mean", "SD overall", "Cpk", "Ppk");
        foreach (var g in report.Groups)
        {
            foreach (var r in g.Readings)
            {
                var whole = report.Readings.FirstOrDefault(x => x.Name == r.Name && x.SequenceId == r.SequenceId);
                var format = whole is null ? NumberText.Value : ReportText.ValueFormat(whole);
                AddRow(readings, g.Key, whole is null ? r.Name : label(whole), NumberText.Count(r.Count), format(r.Mean), format(r.StdDevOverall), NumberText.Index(r.Cpk), NumberText.Index(r.Ppk));
            }
        }

        console.Write(readings);
    }

    private static Table NewTable(string title, params string[] columns)
    {
        var table = new Table { Title = new TableTitle(Escape(title)), Border = TableBorder.Rounded };
        for (var i = 0; i < columns.Length; i++)
        {
            var column = new TableColumn(new Text(columns[i]));

            // The first column holds names, which may wrap; numbers are right-aligned and never split.
            if (i > 0)
            {
                column.RightAligned().NoWrap();
            }

            table.AddColumn(column);
        }

        return table;
    }

    private static void AddRow(Table table, params string[] cells) =>
        table.AddRow(cells.Select(c => (IRenderable)new Text(c)).ToArray());

    // A Text renderable wraps at the console width (long paths included); plain WriteLine would not.
    private static void Line(IAnsiConsole console, string text) => console.Write(new Text(text + "\n"));

    private static string Escape(string text) => Markup.Escape(text);

    private static string Capitalize(string word) => char.ToUpperInvariant(word[0]) + word[1..];
}
