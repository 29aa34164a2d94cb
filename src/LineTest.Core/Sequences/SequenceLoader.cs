using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;

namespace LineTest.Core.Sequences;

/// <summary>Loads a sequence from its file's bytes (the Station reads the file): parse, then check (optionally against a fixture), reporting every problem with its location.</summary>
public static class SequenceLoader
{
    /// <summary>Loads and checks a sequence from bytes (named <paramref name="file"/> in problems).</summary>
    public static LoadResult<SequenceDefinition> Load(string file, byte[] utf8, FixtureDefinition? fixture = null) =>
        Finish(JsonDefinitionReader.Parse<SequenceDefinition>(file, utf8), file, fixture);

    private static LoadResult<SequenceDefinition> Finish(ParsedDefinition<SequenceDefinition> parsed, string file, FixtureDefinition? fixture)
    {
        if (parsed.Value is null || parsed.Problems.Count > 0)
        {
            return LoadResult<SequenceDefinition>.Failure(parsed.Problems, parsed.Sha256);
        }

        var problems = SequenceChecker.Check(parsed.Value, fixture).Locate(file, parsed.Locator);
        return problems.Count == 0
            ? LoadResult<SequenceDefinition>.Success(parsed.Value, parsed.Sha256!)
            : LoadResult<SequenceDefinition>.Failure(problems, parsed.Sha256);
    }
}
