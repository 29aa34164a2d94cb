using LineTest.Core.Results;
using LineTest.Core.Units;
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
}
