using LineTest.Reports.Building;
using LineTest.Reports.Console;
using LineTest.Reports.Loading;
using LineTest.Reports.Tests.Support;
using Microsoft.Extensions.Time.Testing;
using Spectre.Console;

namespace LineTest.Reports.Tests.Console;

public sealed class ReportConsoleWriterTests
{
    [Theory]
    [InlineData(ReportGrouping.None)]
    [InlineData(ReportGrouping.Station)]
    public async Task Write_EightyColumnTerminal_NoLineIsWider(ReportGrouping grouping)
    {
        var directory = await Synthetic.CreateAsync(120, seed: 7);
        var query = new ReportQuery { GroupBy = grouping };
        var report = ReportBuilder.Build(await ResultsLoader.LoadAsync([directory], query), query, new FakeTimeProvider());
        var output = new StringWriter();
        var console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(output),
            Ansi = AnsiSupport.No,
            ColorSystem = ColorSystemSupport.NoColors,
        });
        console.Profile.Width = 80;

        ReportConsoleWriter.Write(report, console);

        var lines = output.ToString().Split('\n').Select(l => l.TrimEnd('\r')).ToList();
        Assert.All(lines, line => Assert.True(line.Length <= 80, $"{line.Length} columns: {line}"));
        var text = output.ToString();
        Assert.Contains("First pass", text, StringComparison.Ordinal);
        Assert.Contains("Capability", text, StringComparison.Ordinal);
        Assert.Contains("Slot bias", text, StringComparison.Ordinal);
        Assert.Contains("cold.output", text, StringComparison.Ordinal);
        if (grouping == ReportGrouping.Station)
        {
            Assert.Contains("ST-02", text, StringComparison.Ordinal);
        }
    }
}
