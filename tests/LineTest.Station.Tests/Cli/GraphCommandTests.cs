using LineTest.Core.Units;

namespace LineTest.Station.Tests.Cli;

public sealed class GraphCommandTests
{
    [Theory]
    [InlineData("dot", "digraph")]
    [InlineData("mermaid", "stateDiagram")]
    public async Task Graph_Format_PrintsEveryState(string format, string header)
    {
        var (exit, output, _) = await CliRunner.RunAsync("graph", "--format", format);

        Assert.Equal(0, exit);
        Assert.Contains(header, output, StringComparison.Ordinal);
        foreach (var state in Enum.GetNames<UnitState>())
        {
            Assert.Contains(state, output, StringComparison.Ordinal);
        }
    }

    [Fact]
    public async Task Graph_UnknownFormat_ExitsTwo()
    {
        var (exit, _, _) = await CliRunner.RunAsync("graph", "--format", "png");

        Assert.Equal(2, exit);
    }
}
