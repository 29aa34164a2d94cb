using LineTest.Core.Definitions;

namespace LineTest.Core.Tests.Definitions;

public sealed class DependentProblemsTests
{
    private static readonly Dictionary<string, string[]> Reads = new(StringComparer.Ordinal)
    {
        ["a"] = [],
        ["b"] = ["a"],
        ["list"] = [DependentProblems.Everything],
    };

    [Theory]
    [InlineData("$", "", null)]
    [InlineData("$.steps", "steps", null)]
    [InlineData("$.steps[12].limits.low", "steps", 12)]
    [InlineData("$.setpoints[0]", "setpoints", 0)]
    [InlineData("$['odd key'].x", "odd key", null)]
    [InlineData("$['it\\'s'][3]", "it's", 3)]
    public void Region_TopLevelKeyAndIndex(string path, string key, int? index) =>
        Assert.Equal((key, index), DependentProblems.Region(path));

    [Fact]
    public void Standing_DropsProblemsInBrokenRegionsAndInRegionsThatReadThem()
    {
        (string, string)[] semantic = [("$.a.x", "1"), ("$.b", "2"), ("$.c", "3")];

        var standing = DependentProblems.Standing(semantic, ["$.a.y"], Reads).ToList();

        // b reads a; c has no entry, so it reads everything.
        Assert.Empty(standing);
        Assert.Equal([("$.a.x", "1")], DependentProblems.Standing(semantic, ["$.b"], Reads).Where(p => p.Path != "$.c"));
    }

    [Fact]
    public void Standing_InAList_KeepsEntriesBeforeTheBrokenOneAndTheListItself()
    {
        (string, string)[] semantic = [("$.list", "count"), ("$.list[1].x", "before"), ("$.list[2]", "at"), ("$.list[5].y", "after"), ("$.a", "other")];

        var standing = DependentProblems.Standing(semantic, ["$.list[2].z"], Reads).Select(p => p.Reason);

        Assert.Equal(["count", "before", "other"], standing);
    }

    [Fact]
    public void Standing_BrokenRoot_DropsEverything() =>
        Assert.Empty(DependentProblems.Standing([("$.a", "1")], ["$"], Reads));

    [Fact]
    public void Standing_NothingBroken_KeepsEverything() =>
        Assert.Equal(2, DependentProblems.Standing([("$.a", "1"), ("$.zzz", "2")], [], Reads).Count());
}
