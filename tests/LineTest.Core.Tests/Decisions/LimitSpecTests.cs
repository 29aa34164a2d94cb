using System.Text.Json;
using LineTest.Core.Decisions;

namespace LineTest.Core.Tests.Decisions;

public sealed class LimitSpecTests
{
    [Fact]
    public void Deserialize_CamelCaseJson_ReadsEveryField()
    {
        const string json = """{ "low": -0.2, "high": 0.2, "unit": "degC", "rule": "guarded", "guardBandFactor": 0.5 }""";

        var spec = JsonSerializer.Deserialize<LimitSpec>(json, new JsonSerializerOptions(JsonSerializerDefaults.Web))!;

        Assert.Equal(-0.2, spec.Low);
        Assert.Equal(0.2, spec.High);
        Assert.Equal("degC", spec.Unit);
        Assert.Equal(DecisionRule.Guarded, spec.Rule);
        Assert.Equal(0.5, spec.GuardBandFactor);
        Assert.Empty(spec.Check());
    }

    [Fact]
    public void Check_NegativeGuardBandFactorAndNoUnit_ListsBoth()
    {
        var problems = new LimitSpec { Unit = " ", GuardBandFactor = -1 }.Check();

        Assert.Equal(2, problems.Count);
        Assert.Contains(problems, p => p.StartsWith("unit:", StringComparison.Ordinal));
        Assert.Contains(problems, p => p.StartsWith("guardBandFactor:", StringComparison.Ordinal));
    }
}
