using System.Globalization;
using LineTest.Core.Results;
using LineTest.Factory.Forwarding;
using Spectre.Console;
using Spectre.Console.Rendering;

namespace LineTest.Station.Screen;

/// <summary>
/// Draws a <see cref="ScreenSnapshot"/> for a terminal (Spectre.Console) within 80×24: the caution line near the top
/// (never pushed off), a table whose column widths never change, and below it one wrapped line per finished slot with
/// its verdict, where the unit goes and the full reason.
/// </summary>
public static class ScreenRenderer
{
    /// <summary>The width the screen is laid out for.</summary>
    public const int Width = 80;

    /// <summary>The height the screen must fit.</summary>
    public const int Height = 24;

    /// <summary>Shown when the block is neither hot nor cold: the inserts still may be.</summary>
    public const string StandingCaution = "CAUTION: inserts may be hot or cold. Use tongs or gloves.";

    /// <summary>The whole screen.</summary>
    public static IRenderable Build(ScreenSnapshot s, string scanBuffer = "")
    {
        ArgumentNullException.ThrowIfNull(s);
        var h = s.Header;
        var rows = new List<IRenderable>
        {
            new Markup($"[bold]LineTest[/] station [bold]{E(h.Station)}[/] · {E(h.Fixture)} · {E(h.Mode)}"),
            new Markup($"sequence [bold]{E(h.Sequence)}[/] r{h.Revision} · lot [bold]{E(h.Lot ?? "-")}[/] · operator [bold]{E(h.Operator ?? "-")}[/]"),
            new Markup(SourceLine(s)),
        };
        var caution = s.Caution ?? StandingCaution;
        var colour = caution.StartsWith("HOT", StringComparison.Ordinal) ? "red" : caution.StartsWith("COLD", StringComparison.Ordinal) ? "deepskyblue1" : "yellow";
        rows.Add(new Markup($"[bold {colour}]{E(caution)}[/]"));
        var used = 4;
        var factoryAt = rows.Count;
        if (s.Alarm is { } alarm)
        {
            rows.Add(new Markup($"[bold white on red]{E(alarm)}[/]"));
            used += Lines(alarm);
        }

        rows.Add(SlotTable(s.Slots));
        used += 4 + s.Slots.Count;
        var below = SlotLines(s.Slots).ToList();
        var tail = new List<(string Markup, string Text)>();
        if (s.Notice is { } notice)
        {
            tail.Add(($"[bold red]![/] {E(notice)}", "! " + notice));
        }

        tail.Add(($"[bold yellow]>[/] {E(s.Prompt)}", "> " + s.Prompt));
        if (scanBuffer.Length > 0)
        {
            tail.Add(($"  typed: [bold]{E(scanBuffer)}[/]", "  typed: " + scanBuffer));
        }

        used += below.Sum(b => Lines(b.Text)) + tail.Sum(t => Lines(t.Text));
        var info = new List<string>();
        foreach (var line in s.Info ?? [])
        {
            // Information lines give way first: the slot lines, the prompt and the caution never do.
            if (used + Lines(line) > Height)
            {
                info.Add("…");
                break;
            }

            info.Add(line);
            used += Lines(line);
        }

        rows.AddRange(below.Select(b => new Markup(b.Markup)));
        rows.AddRange(info.Select(i => new Markup($"[grey]{E(i)}[/]")));
        rows.AddRange(tail.Select(t => new Markup(t.Markup)));
        if (s.Factory is { } factory && used < Height)
        {
            // The forwarding backlog, one line below the caution. Waiting runs are safe in the station's own database,
            // so the line is yellow while any wait, never an alarm, and it is the first to give way on a full screen
            // (the log has it too); it comes back at the next redraw with room.
            var text = factory.Describe();
            text = text.Length > Width ? text[..(Width - 1)] + "…" : text;
            rows.Insert(factoryAt, new Markup($"[{(factory.Count == 0 && factory.Problem is null ? "grey" : "yellow")}]{E(text)}[/]"));
        }

        return new Rows(rows);
    }

    /// <summary>The same facts as plain lines, for a log or a terminal without ANSI.</summary>
    public static IReadOnlyList<string> PlainLines(ScreenSnapshot s)
    {
        ArgumentNullException.ThrowIfNull(s);
        var lines = new List<string> { Markup.Remove(SourceLine(s)) };
        if (s.Factory is { } factory)
        {
            lines.Add(factory.Describe());
        }

        if (s.Caution is { } caution)
        {
            lines.Add(caution);
        }

        foreach (var slot in s.Slots)
        {
            lines.Add(string.Create(CultureInfo.InvariantCulture,
                $"slot {slot.Slot}  {slot.Serial ?? "-",-18}  {DoingText(slot),-25}  {(int)(slot.Progress * 100),3} %  {VerdictWord(slot)}"));
        }

        lines.AddRange(SlotLines(s.Slots).Select(b => b.Text));
        if (s.Notice is { } notice)
        {
            lines.Add("! " + notice);
        }

        lines.Add("> " + s.Prompt);
        return lines;
    }

    /// <summary>What the "Doing" column says for a slot.</summary>
    public static string DoingText(SlotView slot)
    {
        ArgumentNullException.ThrowIfNull(slot);
        if (slot.OutOfService is not null)
        {
            return "out of service";
        }

        if (slot.Cancelled)
        {
            return "cancelled";
        }

        return slot.Doing.Length > 0 ? slot.Doing : StateWords.Of(slot.State);
    }

    private static IEnumerable<(string Markup, string Text)> SlotLines(IReadOnlyList<SlotView> slots)
    {
        foreach (var slot in slots)
        {
            if (slot.OutOfService is { } why)
            {
                yield return ($"[grey]slot {slot.Slot} out of service:[/] {E(why)}", $"slot {slot.Slot} out of service: {why}");
                continue;
            }

            if (slot.Verdict is not { } verdict)
            {
                continue;
            }

            var word = VerdictWord(slot);
            var to = slot.Disposition is { } place ? $" → {place}" : string.Empty;
            var reason = verdict == Verdict.Pass || slot.Reason is null ? string.Empty : $": {slot.Reason}";
            yield return ($"[bold]slot {slot.Slot} {word}{E(to)}[/]{E(reason)}", $"slot {slot.Slot} {word}{to}{reason}");
        }
    }

    private static Table SlotTable(IReadOnlyList<SlotView> slots)
    {
        // Fixed widths (4+18+18+8+5+7 plus borders and padding = 79 columns): the table never jumps between redraws.
        var table = new Table().Border(TableBorder.Rounded);
        table.AddColumn(new TableColumn("Slot") { Width = 4, NoWrap = true }.Centered());
        table.AddColumn(new TableColumn("Serial") { Width = 18, NoWrap = true });
        table.AddColumn(new TableColumn("Doing") { Width = StepWords.Width, NoWrap = true });
        table.AddColumn(new TableColumn("Progress") { Width = 8, NoWrap = true });
        table.AddColumn(new TableColumn("Left") { Width = 5, NoWrap = true }.RightAligned());
        table.AddColumn(new TableColumn("Verdict") { Width = 7, NoWrap = true }.Centered());
        foreach (var slot in slots)
        {
            var doing = slot.State is null && slot.OutOfService is null ? "[grey]empty[/]" : E(Fit(DoingText(slot), StepWords.Width));
            table.AddRow(
                new Markup($"[bold]{slot.Slot}[/]"),
                new Markup(E(Fit(slot.Serial ?? "-", 18))),
                new Markup(doing),
                new Markup(slot.OutOfService is null && slot.State is not null ? Bar(slot.Progress) : string.Empty),
                new Markup(slot.TimeLeft is { } left && slot.Verdict is null ? $"{(int)left.TotalMinutes}:{left.Seconds:D2}" : string.Empty),
                new Markup(VerdictMarkup(slot)));
        }

        return table;
    }

    private static string SourceLine(ScreenSnapshot s)
    {
        var setpoint = s.SetpointC is { } sp ? string.Create(CultureInfo.InvariantCulture, $"{sp:0.0} °C") : "-";
        var actual = s.ReferenceC is { } rc ? string.Create(CultureInfo.InvariantCulture, $"{rc:0.00} °C") : "-";
        return $"block: setpoint [bold]{setpoint}[/], reference [bold]{actual}[/] ({E(s.SourcePhase)})";
    }

    private static string VerdictWord(SlotView slot) => slot.OutOfService is not null ? "OFF" : slot.Verdict is { } v ? StateWords.Of(v) : string.Empty;

    private static string VerdictMarkup(SlotView slot) => slot.OutOfService is not null ? "[grey]OFF[/]" : slot.Verdict switch
    {
        Verdict.Pass => "[bold white on green]PASS[/]",
        Verdict.Fail => "[bold white on red]FAIL[/]",
        Verdict.Error => "[bold black on yellow]ERROR[/]",
        _ => string.Empty,
    };

    private static string Bar(double progress)
    {
        const int width = 8;
        var filled = (int)Math.Round(Math.Clamp(progress, 0, 1) * width);
        return $"[green]{new string('#', filled)}[/][grey]{new string('.', width - filled)}[/]";
    }

    private static int Lines(string text) => Math.Max(1, (text.Length + Width - 1) / Width);

    private static string Fit(string text, int max) => text.Length <= max ? text : text[..(max - 1)] + "…";

    private static string E(string text) => Markup.Escape(text);
}
