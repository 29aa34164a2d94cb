using LineTest.Core.Definitions;

namespace LineTest.Core.Fixtures;

/// <summary>Loads a fixture from its file's bytes (the Station reads the file): parse, then check, reporting every problem with its location.</summary>
public static class FixtureLoader
{
    /// <summary>Extra checks supplied by the caller (e.g. that the reference sensor definition is usable).</summary>
    public delegate void ExtraCheck(FixtureDefinition fixture, ProblemList problems);

    /// <summary>Loads and checks a fixture from bytes.</summary>
    public static LoadResult<FixtureDefinition> Load(string file, byte[] utf8, ExtraCheck? extra = null) =>
        Finish(JsonDefinitionReader.Parse<FixtureDefinition>(file, utf8), file, extra);

    private static LoadResult<FixtureDefinition> Finish(ParsedDefinition<FixtureDefinition> parsed, string file, ExtraCheck? extra)
    {
        if (parsed.Value is null || parsed.Problems.Count > 0)
        {
            return LoadResult<FixtureDefinition>.Failure(parsed.Problems, parsed.Sha256);
        }

        var problems = FixtureChecker.Check(parsed.Value);
        extra?.Invoke(parsed.Value, problems);
        var located = problems.Locate(file, parsed.Locator);
        return located.Count == 0
            ? LoadResult<FixtureDefinition>.Success(parsed.Value, parsed.Sha256!)
            : LoadResult<FixtureDefinition>.Failure(located, parsed.Sha256);
    }
}
