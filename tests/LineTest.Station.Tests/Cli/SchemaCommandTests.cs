using LineTest.Core.Definitions;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

public sealed class SchemaCommandTests
{
    [Fact]
    public void CommittedSequenceSchema_MatchesTheModel()
    {
        // Regenerate with: dotnet run --project src/LineTest.Station -- schema --out sequences/sequence.schema.json
        var committed = File.ReadAllText(RepoFiles.Path("sequences/sequence.schema.json"));
        Assert.Equal(DefinitionSchemas.Sequence(), committed.ReplaceLineEndings("\n"));
    }

    [Fact]
    public void CommittedFixtureSchema_MatchesTheModel()
    {
        // Regenerate with: dotnet run --project src/LineTest.Station -- schema --kind fixture --out fixtures/fixture.schema.json
        var committed = File.ReadAllText(RepoFiles.Path("fixtures/fixture.schema.json"));
        Assert.Equal(DefinitionSchemas.Fixture(), committed.ReplaceLineEndings("\n"));
    }

    [Fact]
    public void EverySequenceAndFixture_ReferencesItsSchema()
    {
        foreach (var file in Directory.GetFiles(RepoFiles.Path("sequences"), "*.json").Where(f => !f.EndsWith(".schema.json", StringComparison.Ordinal)))
        {
            Assert.Contains("\"$schema\": \"./sequence.schema.json\"", File.ReadAllText(file), StringComparison.Ordinal);
        }

        foreach (var file in Directory.GetFiles(RepoFiles.Path("fixtures"), "*.json").Where(f => !f.EndsWith(".schema.json", StringComparison.Ordinal)))
        {
            Assert.Contains("\"$schema\": \"./fixture.schema.json\"", File.ReadAllText(file), StringComparison.Ordinal);
        }
    }

    [Fact]
    public async Task Schema_Stdout_IsTheSequenceSchema()
    {
        var (exit, output, _) = await CliRunner.RunAsync("schema");

        Assert.Equal(0, exit);
        Assert.Equal(DefinitionSchemas.Sequence(), output);
        Assert.Contains("\"const\": \"settle\"", output, StringComparison.Ordinal);
    }
}
