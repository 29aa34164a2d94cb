using System.Globalization;
using LineTest.Core.Results;
using Spectre.Console;
using Spectre.Console.Rendering;

namespace LineTest.Station.Screen;

/// <summary>Draws a <see cref="ScreenSnapshot"/> for a terminal (Spectre.Console), fitting 80 columns.</summary>
public static class ScreenRenderer
{
    /// <summary>The whole screen.</summary>
    public static IRenderable Build(ScreenSnapshot s, string scanBuffer = "")
    {
        ArgumentNullException.ThrowIfNull(s);
        var h = s.Header;
        var rows = new List<IRenderable>
        {
            new Markup($"[bold]LineTest[/] station [bold]{E(h.Station)}[/] · {E(h.Fixture)}"),
            new Markup($"sequence [bold]{E(h.Sequence)}[/] r{h.Revision} · lot {E(h.Lot ?? "-")} · operator {E(h.Operator ?? "-")} · {E(h.Mode)}"),
            new Markup(SourceLine(s)),
        };
        if (s.Alarm is { } alarm)
        {
            rows.Add(new Panel(new Markup($"[bold white]{E(alarm)}[/]")).BorderColor(Color.Red).Expand());
        }

        if (s.Caution is { } caution)
        {
            var colour = caution.StartsWith("HOT", StringComparison.Ordinal) ? "red" : "deepskyblue1";
            rows.Add(new Markup($"[bold {colour}]{E(caution)}[/]"));
        }

        rows.Add(SlotTable(s.Slots));
        foreach (var slot in s.Slots.Where(x => x.Verdict is Verdict.Fail or Verdict.Error && x.Reason is not null))
        {
            rows.Add(new Markup($"[grey]slot {slot.Slot}:[/] {E(Shorten(slot.Reason!, 70))}"));
        }

        if (s.Notice is { } notice)
        {
            rows.Add(new Markup($"[bold red]![/] {E(notice)}"));
        }

        rows.Add(new Markup($"[bold yellow]>[/] {E(s.Prompt)}"));
        if (scanBuffer.Length > 0)
        {
            rows.Add(new Markup($"  scanned: [bold]{E(scanBuffer)}[/]"));
        }

        return new Rows(rows);
    }

    /// <summary>The same facts as plain lines, for a log or a terminal without ANSI.</summary>
    public static IReadOnlyList<string> PlainLines(ScreenSnapshot s)
    {
        ArgumentNullException.ThrowIfNull(s);
        var lines = new List<string> { Markup.Remove(SourceLine(s)) };
        if (s.Caution is { } caution)
        {
            lines.Add(caution);
        }

        foreach (var slot in s.Slots)
        {
            lines.Add(string.Create(CultureInfo.InvariantCulture,
                $"slot {slot.Slot}  {slot.Serial ?? "-",-18}  {StateWords.Of(slot.State),-25}  {(int)(slot.Progress * 100),3} %  {(slot.Verdict is { } v ? StateWords.Of(v) : string.Empty)}"));
        }

        if (s.Notice is { } notice)
        {
            lines.Add("! " + notice);
        }

        lines.Add("> " + s.Prompt);
        return lines;
    }

    private static Table SlotTable(IReadOnlyList<SlotView> slots)
    {
        var table = new Table().Border(TableBorder.Rounded).Expand();
        table.AddColumn(new TableColumn("Slot").Centered());
        table.AddColumn("Serial");
        table.AddColumn("Doing");
        table.AddColumn("Progress");
        table.AddColumn(new TableColumn("Left").RightAligned());
        table.AddColumn(new TableColumn("Verdict").Centered());
        foreach (var slot in slots)
        {
            var doing = slot.State is null ? "[grey]empty[/]" : E(Shorten(StateWords.Of(slot.State) + (slot.Step.Length > 0 && slot.Verdict is null && slot.State is Core.Units.UnitState.Measuring or Core.Units.UnitState.Verifying ? $" {slot.Step}" : string.Empty), 24));
            if (slot.IsRetest && slot.Verdict is null)
            {
                doing += " [grey](retest)[/]";
            }

            table.AddRow(
                new Markup($"[bold]{slot.Slot}[/]"),
                new Markup(E(slot.Serial ?? "-")),
                new Markup(doing),
                new Markup(Bar(slot.Progress)),
                new Markup(slot.TimeLeft is { } left && slot.Verdict is null ? $"{(int)left.TotalMinutes}:{left.Seconds:D2}" : string.Empty),
                new Markup(VerdictMarkup(slot.Verdict)));
        }

        return table;
    }

    private static string SourceLine(ScreenSnapshot s)
    {
        var setpoint = s.SetpointC is { } sp ? string.Create(CultureInfo.InvariantCulture, $"{sp:0.0} °C") : "-";
        var actual = s.ReferenceC is { } rc ? string.Create(CultureInfo.InvariantCulture, $"{rc:0.00} °C") : "-";
        return $"block: setpoint [bold]{setpoint}[/], reference [bold]{actual}[/] ({E(s.SourcePhase)})";
    }

    private static string VerdictMarkup(Verdict? verdict) => verdict switch
    {
        Core.Results.Verdict.Pass => "[bold white on green] PASS [/]",
        Core.Results.Verdict.Fail => "[bold white on red] FAIL [/]",
        Core.Results.Verdict.Error => "[bold black on yellow] ERROR [/]",
        _ => string.Empty,
    };

    private static string Bar(double progress)
    {
        const int width = 10;
        var filled = (int)Math.Round(Math.Clamp(progress, 0, 1) * width);
        return $"[green]{new string('#', filled)}[/][grey]{new string('.', width - filled)}[/]";
    }

    private static string Shorten(string text, int max) => text.Length <= max ? text : text[..(max - 1)] + "…";

    private static string E(string text) => Markup.Escape(text);
}
