using System.Text.Json.Nodes;
using LineTest.Core.Definitions;
using LineTest.Station.Composition;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

public sealed class SchemaCommandTests
{
    [Fact]
    public void CommittedSequenceSchema_MatchesTheModel()
    {
        // Regenerate with: dotnet run --project src/LineTest.Station -- schema --out sequences/sequence.schema.json
        var committed = File.ReadAllText(RepoFiles.Path("sequences/sequence.schema.json"));
        Assert.Equal(DefinitionSchemas.Sequence(ModelDocs.ForCoreModel().Describe), committed.ReplaceLineEndings("\n"));
    }

    [Fact]
    public void CommittedFixtureSchema_MatchesTheModel()
    {
        // Regenerate with: dotnet run --project src/LineTest.Station -- schema --kind fixture --out fixtures/fixture.schema.json
        var committed = File.ReadAllText(RepoFiles.Path("fixtures/fixture.schema.json"));
        Assert.Equal(DefinitionSchemas.Fixture(ModelDocs.ForCoreModel().Describe), committed.ReplaceLineEndings("\n"));
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
        Assert.Equal(DefinitionSchemas.Sequence(ModelDocs.ForCoreModel().Describe), output);
        Assert.Contains("\"const\": \"settle\"", output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("sequences/sequence.schema.json")]
    [InlineData("fixtures/fixture.schema.json")]
    public void CommittedSchema_EveryKeyHasADescription(string file)
    {
        var root = JsonNode.Parse(File.ReadAllText(RepoFiles.Path(file)))!;

        var undescribed = Properties(root, "$").Where(p => p.Schema["description"] is null).Select(p => p.Path).ToList();

        Assert.Empty(undescribed);
    }

    [Fact]
    public void CommittedSequenceSchema_UnitIsAnEnumSoAnEditorFlagsMa()
    {
        var root = JsonNode.Parse(File.ReadAllText(RepoFiles.Path("sequences/sequence.schema.json")))!;

        var units = Properties(root, "$").Where(p => p.Path.EndsWith(".unit", StringComparison.Ordinal)).ToList();

        Assert.NotEmpty(units);
        Assert.All(units, u =>
        {
            var words = u.Schema["enum"]!.AsArray().Select(w => w!.GetValue<string>()).ToList();
            Assert.Contains("mA", words);
            Assert.DoesNotContain("ma", words);
        });
    }

    [Fact]
    public void CommittedSchemas_CarryTheBoundsOfTheTable()
    {
        var fixture = JsonNode.Parse(File.ReadAllText(RepoFiles.Path("fixtures/fixture.schema.json")))!;
        var sequence = JsonNode.Parse(File.ReadAllText(RepoFiles.Path("sequences/sequence.schema.json")))!;

        var tau = Properties(fixture, "$").Single(p => p.Path == "$.source.settlingTimeConstantSeconds").Schema;
        var noise = Properties(fixture, "$").Single(p => p.Path == "$.simulation.blockNoiseC").Schema;
        var samples = Properties(sequence, "$").Where(p => p.Path.EndsWith(".samples", StringComparison.Ordinal)).Select(p => p.Schema).ToList();
        var registers = Properties(sequence, "$").Where(p => p.Path.EndsWith(".register", StringComparison.Ordinal)).Select(p => p.Schema).ToList();

        Assert.Equal(0, tau["exclusiveMinimum"]!.GetValue<double>());
        Assert.Equal(DefinitionBounds.TimeConstantSeconds.Maximum, tau["maximum"]!.GetValue<double>());
        Assert.Equal(0, noise["minimum"]!.GetValue<double>());
        Assert.NotEmpty(samples);
        Assert.All(samples, s => Assert.Equal(DefinitionBounds.Samples.Maximum, s["maximum"]!.GetValue<double>()));
        Assert.NotEmpty(registers);
        Assert.All(registers, r => Assert.Equal(DefinitionBounds.RegisterName.Pattern, r["pattern"]!.GetValue<string>()));
    }

    /// <summary>Every property schema below <paramref name="node"/>, with a path of its keys (array items and variants are not named).</summary>
    private static IEnumerable<(string Path, JsonObject Schema)> Properties(JsonNode node, string path)
    {
        switch (node)
        {
            case JsonObject obj:
                if (obj["properties"] is JsonObject properties)
                {
                    foreach (var (key, value) in properties)
                    {
                        if (value is JsonObject schema)
                        {
                            yield return ($"{path}.{key}", schema);
                            foreach (var inner in Properties(schema, $"{path}.{key}"))
                            {
                                yield return inner;
                            }
                        }
                    }
                }

                foreach (var (key, value) in obj)
                {
                    if (key != "properties" && value is not null)
                    {
                        foreach (var inner in Properties(value, path))
                        {
                            yield return inner;
                        }
                    }
                }

                break;
            case JsonArray array:
                foreach (var item in array.OfType<JsonNode>())
                {
                    foreach (var inner in Properties(item, path))
                    {
                        yield return inner;
                    }
                }

                break;
        }
    }
}
