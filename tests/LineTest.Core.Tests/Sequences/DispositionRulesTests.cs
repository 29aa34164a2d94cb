using LineTest.Core.Definitions;
using LineTest.Core.Sequences;

namespace LineTest.Core.Tests.Sequences;

public sealed class DispositionRulesTests
{
    private static readonly SequenceDefinition Sequence = new()
    {
        Id = "ctp40a-dac",
        Revision = 1,
        Product = "CTP-40A",
        SerialPattern = "^CTP40A-[0-9]{4}-[0-9]{6}$",
        Stability = new StabilitySettings { BandC = 0.05, MaxDriftCPerMinute = 0.02, WindowSeconds = 60, TimeoutSeconds = 1800 },
        Soak = new SoakSettings { MaxDriftCPerMinute = 0.05, WindowSeconds = 30, TimeoutSeconds = 900 },
        Setpoints = [],
        Steps = [],
    };

    [Fact]
    public void Check_ExampleMatchingThePatternAndNamedPlaces_NoProblem()
    {
        var problems = new ProblemList();

        DispositionRules.Check(Sequence with { SerialExample = "CTP40A-2612-000123", Dispositions = new DispositionSettings { Pass = "tray", Fail = "bin" } }, problems);

        Assert.Empty(problems.Items);
    }

    [Fact]
    public void Check_ExampleNotMatchingThePattern_IsRefusedAtItsPath()
    {
        var problems = new ProblemList();

        DispositionRules.Check(Sequence with { SerialExample = "CTP40A-26-1" }, problems);

        var (path, reason) = Assert.Single(problems.Items);
        Assert.Equal("$.serialExample", path);
        Assert.Contains("does not match the serial pattern", reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_EmptyPlaces_AreRefusedAtTheirPaths()
    {
        var problems = new ProblemList();

        DispositionRules.Check(Sequence with { Dispositions = new DispositionSettings { Fail = " ", ByReading = new Dictionary<string, string> { ["verify.error"] = "" } } }, problems);

        Assert.Equal(["$.dispositions.fail", "$.dispositions.byReading['verify.error']"], problems.Items.Select(p => p.Path));
    }
}
