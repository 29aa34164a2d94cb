using LineTest.Core.Results;
using LineTest.Core.Units;
using LineTest.Factory.Forwarding;
using LineTest.Station.Screen;
using Spectre.Console;

namespace LineTest.Station.Tests.Screen;

public sealed class ScreenRendererTests
{
    [Fact]
    public void Build_FullFixtureWithCautionAndReasons_FitsEightyColumns()
    {
        var slots = new List<SlotView>
        {
            new(1) { Serial = "CTP40A-2612-000001", State = UnitState.Soaking, Step = "settle", Progress = 0.4, TimeLeft = TimeSpan.FromMinutes(17) },
            new(2) { Serial = "CTP40A-2612-000002", State = UnitState.Passed, Verdict = Verdict.Pass, Progress = 1 },
            new(3) { Serial = "CTP40A-2612-000003", State = UnitState.Failed, Verdict = Verdict.Fail, Progress = 1, Reason = "verify.error: -5.58 degC is below the acceptance limit -0.478 degC" },
            new(4) { Serial = "CTP40A-2612-000004", State = UnitState.Errored, Verdict = Verdict.Error, Progress = 1, Reason = "the unit does not answer on its link (slot 4)", IsRetest = true },
        };
        var snapshot = new ScreenSnapshot(
            new ScreenHeader("ST-01", "Simulated four-well dry block", "ctp40a-dac", 1, "L-2612-07", "A. Operator", "production"),
            slots, -20, -19.98, "stable", "Scan the serial for slot 1 (or type 'N SERIAL' for slot N).", "COLD: the block is at -20 °C. Cold surfaces can freeze skin; use gloves.", null,
            "Refused: CTP40A-2612-000009 was scanned while a batch runs; scan it again when the batch is done.");
        var writer = new StringWriter();
        var console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(writer),
            Ansi = AnsiSupport.No,
            ColorSystem = ColorSystemSupport.NoColors,
            Interactive = InteractionSupport.No,
        });
        console.Profile.Width = 80;

        console.Write(ScreenRenderer.Build(snapshot, "CTP40A-26"));

        var output = writer.ToString();
        var lines = output.TrimEnd().Split('\n');
        Assert.All(lines, l => Assert.True(l.TrimEnd('\r').Length <= 80, $"too wide: '{l}'"));
        Assert.Contains("PASS", output, StringComparison.Ordinal);
        Assert.Contains("FAIL", output, StringComparison.Ordinal);
        Assert.Contains("ERROR", output, StringComparison.Ordinal);
        Assert.Contains("COLD", output, StringComparison.Ordinal);
        Assert.Contains("CTP40A-26", output, StringComparison.Ordinal);
        Assert.Contains("! Refused: CTP40A-2612-000009 was scanned", output, StringComparison.Ordinal);
        Assert.True(lines.Length <= 24, $"{lines.Length} lines do not fit an 80×24 terminal");
    }

    [Fact]
    public void Build_EndScreenFourFailedSlotsWithLongReasons_FitsEightyByTwentyFourWithCautionAndEveryReasonWhole()
    {
        // What broke: at 80 columns the fail reason was cut and the end screen was one or two lines too tall, so the
        // caution line scrolled off as the operator reached into the block.
        var reasons = new[]
        {
            "verify.error: -5.58 degC is below the acceptance limit -0.478 degC (guarded by the expanded uncertainty 0.022 degC)",
            "iv-high.tempco: -2.61 mV/degC is below the limit -2.4 mV/degC",
            "cancelled by the operator",
            "the unit does not answer on its link (slot 4): no reply within 500 ms after 3 tries",
        };
        var slots = Enumerable.Range(1, 4).Select(i => new SlotView(i)
        {
            Serial = $"CTP40A-2612-00000{i}",
            State = i == 2 ? UnitState.Failed : UnitState.Errored,
            Verdict = i == 2 ? Verdict.Fail : Verdict.Error,
            Progress = i == 3 ? 0.4 : 1,
            Reason = reasons[i - 1],
            Cancelled = i == 3,
            Disposition = i == 2 ? "red reject bin" : "yellow retest rack",
            IsRetest = true,
        }).ToList();
        var snapshot = new ScreenSnapshot(
            new ScreenHeader("ST-01", "Simulated four-well dry block", "ctp40a-dac", 1, "L-2612-07", "badge-0412", "production"),
            slots, 5, 5.01, "stable", "Batch done: 0 pass, 1 fail, 3 error. Put each unit where its slot line says (inserts may be hot or cold), then scan the next.",
            null, null, "Refused: CTP40A-2612-000009 was scanned while a batch runs; scan it again when the batch is done.");

        var lines = Render(snapshot, "CTP40A-26");

        Assert.True(lines.Count <= 24, $"{lines.Count} lines do not fit an 80×24 terminal:\n{string.Join("\n", lines)}");
        Assert.All(lines, l => Assert.True(l.Length <= 80, $"too wide: '{l}'"));
        Assert.Contains(lines, l => l.StartsWith("CAUTION", StringComparison.Ordinal));
        var text = string.Join(" ", lines.Select(l => l.Trim()));
        foreach (var reason in reasons)
        {
            Assert.Contains(reason, text, StringComparison.Ordinal);
        }

        Assert.Contains("slot 2 FAIL → red reject bin", text, StringComparison.Ordinal);
        Assert.Contains("slot 4 ERROR → yellow retest rack", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Build_FullEndScreenWithFactoryBacklog_BacklogGivesWaySoCautionAndReasonsStillFit()
    {
        // The tallest end screen of the test above (24 lines), with a backlog to show.
        var reasons = new[]
        {
            "verify.error: -5.58 degC is below the acceptance limit -0.478 degC (guarded by the expanded uncertainty 0.022 degC)",
            "iv-high.tempco: -2.61 mV/degC is below the limit -2.4 mV/degC",
            "cancelled by the operator",
            "the unit does not answer on its link (slot 4): no reply within 500 ms after 3 tries",
        };
        var slots = Enumerable.Range(1, 4).Select(i => new SlotView(i)
        {
            Serial = $"CTP40A-2612-00000{i}",
            State = i == 2 ? UnitState.Failed : UnitState.Errored,
            Verdict = i == 2 ? Verdict.Fail : Verdict.Error,
            Progress = i == 3 ? 0.4 : 1,
            Reason = reasons[i - 1],
            Cancelled = i == 3,
            Disposition = i == 2 ? "red reject bin" : "yellow retest rack",
            IsRetest = true,
        }).ToList();
        var backlog = new FactoryBacklogStatus(
            12, new DateTimeOffset(2026, 12, 2, 6, 41, 0, TimeSpan.Zero), null, "Failed to connect to 10.0.0.5:5432", 4);
        var snapshot = new ScreenSnapshot(
            new ScreenHeader("ST-01", "Simulated four-well dry block", "ctp40a-dac", 1, "L-2612-07", "badge-0412", "production"),
            slots, 5, 5.01, "stable", "Batch done: 0 pass, 1 fail, 3 error. Put each unit where its slot line says (inserts may be hot or cold), then scan the next.",
            null, null, "Refused: CTP40A-2612-000009 was scanned while a batch runs; scan it again when the batch is done.", Factory: backlog);

        var lines = Render(snapshot, "CTP40A-26");

        Assert.True(lines.Count <= 24, $"{lines.Count} lines do not fit an 80×24 terminal:\n{string.Join("\n", lines)}");
        Assert.All(lines, l => Assert.True(l.Length <= 80, $"too wide: '{l}'"));
        Assert.Contains(lines, l => l.StartsWith("CAUTION", StringComparison.Ordinal));
        var text = string.Join(" ", lines.Select(l => l.Trim()));
        foreach (var reason in reasons)
        {
            Assert.Contains(reason, text, StringComparison.Ordinal);
        }

        Assert.DoesNotContain("factory:", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Build_BatchRunningWithFactoryBacklog_OneLineBelowTheCautionWithCountAndOldest()
    {
        var slots = Enumerable.Range(1, 4).Select(i => new SlotView(i)
        {
            Serial = $"CTP40A-2612-00000{i}",
            State = UnitState.Soaking,
            Step = "settle",
            Progress = 0.4,
            TimeLeft = TimeSpan.FromMinutes(17),
        }).ToList();
        var backlog = new FactoryBacklogStatus(
            12, new DateTimeOffset(2026, 12, 2, 6, 41, 0, TimeSpan.Zero), null, "Failed to connect to 10.0.0.5:5432: connection refused", 4);
        var snapshot = new ScreenSnapshot(
            new ScreenHeader("ST-01", "Simulated four-well dry block", "ctp40a-dac", 1, "L-2612-07", "badge-0412", "production"),
            slots, 5, 5.01, "stable", "Batch running.", null, null, Factory: backlog);

        var lines = Render(snapshot, string.Empty);

        Assert.True(lines.Count <= 24, $"{lines.Count} lines do not fit an 80×24 terminal");
        var caution = lines.FindIndex(l => l.StartsWith("CAUTION", StringComparison.Ordinal));
        Assert.StartsWith("factory: 12 run(s) waiting since 2026-12-02 06:41 UTC (Failed to connect", lines[caution + 1], StringComparison.Ordinal);
        Assert.True(lines[caution + 1].Length <= 80);
        Assert.StartsWith("╭", lines[caution + 2], StringComparison.Ordinal);
    }

    [Fact]
    public void Build_NoFactory_NoFactoryLine()
    {
        var lines = Render(Snapshot([new SlotView(1)]), string.Empty);

        Assert.DoesNotContain(lines, l => l.Contains("factory", StringComparison.Ordinal));
    }

    [Fact]
    public void Build_CancelledSlot_SaysCancelledWithTheBarWhereItStopped()
    {
        var slot = new SlotView(3) { Serial = "CTP40A-2612-000003", State = UnitState.Errored, Verdict = Verdict.Error, Progress = 0.5, Cancelled = true, Reason = "cancelled by the operator" };

        var row = Render(Snapshot([slot]), string.Empty).Single(l => l.Contains("CTP40A-2612-000003", StringComparison.Ordinal) && l.StartsWith('│'));

        Assert.Contains("cancelled", row, StringComparison.Ordinal);
        Assert.Contains("####....", row, StringComparison.Ordinal);
    }

    [Fact]
    public void Build_AnyContent_ColumnWidthsNeverChangeBetweenRedraws()
    {
        // What broke: column widths jumped between redraws, and "(retest)" wrapped.
        var empty = Render(Snapshot([new SlotView(1)]), string.Empty);
        var full = Render(Snapshot([new SlotView(1) { Serial = "CTP40A-2612-000001", State = UnitState.Loaded, Doing = "loaded (retest)", IsRetest = true }]), string.Empty);
        var done = Render(Snapshot([new SlotView(1) { Serial = "CTP40A-2612-000001", State = UnitState.Passed, Verdict = Verdict.Pass, Progress = 1 }]), string.Empty);

        var borders = new[] { empty, full, done }.Select(lines => lines.First(l => l.StartsWith('╭'))).Distinct().ToList();
        Assert.Single(borders);
        Assert.Contains(full, l => l.Contains("loaded (retest)", StringComparison.Ordinal));
        Assert.Equal(empty.Count, full.Count);
    }

    private static ScreenSnapshot Snapshot(IReadOnlyList<SlotView> slots) =>
        new(new ScreenHeader("ST-01", "DB4", "ctp40a-dac", 1, null, null, "engineering"), slots, null, null, "idle", "Scan the serial for slot 1.", null, null);

    private static List<string> Render(ScreenSnapshot snapshot, string typed)
    {
        var writer = new StringWriter();
        var console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(writer),
            Ansi = AnsiSupport.No,
            ColorSystem = ColorSystemSupport.NoColors,
            Interactive = InteractionSupport.No,
        });
        console.Profile.Width = 80;
        console.Write(ScreenRenderer.Build(snapshot, typed));
        return writer.ToString().TrimEnd().Split('\n').Select(l => l.TrimEnd('\r')).ToList();
    }
}
