using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Station.Campaign;
using LineTest.Station.Composition;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Campaign;

public sealed class FuzzerTests
{
    public static TheoryData<string> DemoSequences => new(
        Directory.GetFiles(RepoFiles.Path("sequences"), "*.json")
            .Where(f => !f.EndsWith(".schema.json", StringComparison.Ordinal))
            .Select(f => Path.GetRelativePath(RepoFiles.Path("."), f))
            .Order(StringComparer.Ordinal));

    [Theory]
    [MemberData(nameof(DemoSequences))]
    public async Task RunAsync_GarbageWrapperMissedTheSourceMeter_GarbageBatchesStillReachTrimAndVerify(string sequenceFile)
    {
        // The garbage instruments once passed no source-measure unit on: every garbage batch of the default sequence
        // stopped at its first iv-sweep, so fuzzing never exercised trim or verify, and nothing noticed.
        var fixturePath = RepoFiles.Path("fixtures/sim-dryblock-4.json");
        var fixture = DefinitionFiles.ReadFixture(fixturePath).Value!;
        var sequencePath = RepoFiles.Path(sequenceFile);
        var loaded = DefinitionFiles.ReadSequence(sequencePath, fixture);
        Assert.True(loaded.IsSuccess, string.Join("\n", loaded.Problems));
        var fuzzer = new Fuzzer(fixture, File.ReadAllBytes(fixturePath), loaded.Value!, File.ReadAllBytes(sequencePath), loaded.Sha256!, seed: 4040);

        var found = await fuzzer.RunAsync(loaderCases: 0, garbageBatches: 12, CancellationToken.None);

        Assert.True(found.GarbageReplies > 0, "no garbage was injected");
        Assert.Equal(0, found.UnhandledInBatches);
        Assert.Equal(0, found.UnitsWithoutVerdict);
        Assert.True(found.ReachedTrim > 0, $"no unit of {sequenceFile} reached its trim on garbage instruments ({found.Error} errors)");
        Assert.True(found.ReachedVerify > 0, $"no unit of {sequenceFile} reached its verify on garbage instruments ({found.Error} errors)");
    }
}
