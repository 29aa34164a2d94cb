using LineTest.Core.Definitions;

namespace LineTest.Core.Tests.Definitions;

public sealed class DefinitionProblemTests
{
    [Fact]
    public void ToString_WithLine_IsFileLinePathReason()
    {
        var problem = new DefinitionProblem("sequences/a.json", 12, "$.steps[3].setpoint", "setpoint 'x' does not exist");

        Assert.Equal("sequences/a.json:12: $.steps[3].setpoint: setpoint 'x' does not exist", problem.ToString());
    }

    [Fact]
    public void ToString_WithoutLine_LeavesTheLineOut()
    {
        var problem = new DefinitionProblem("missing.json", null, "$", "file not found");

        Assert.Equal("missing.json: $: file not found", problem.ToString());
    }
}
