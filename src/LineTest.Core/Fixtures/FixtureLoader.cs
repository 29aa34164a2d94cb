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

    /// <summary>
    /// Which top-level keys the checks that report under each key read (<see cref="DependentProblems"/>), from
    /// <see cref="FixtureChecker"/>: the rig decides which ports are needed, slots and the source-measure unit are checked
    /// against each other, the simulation's offsets against the slots.
    /// </summary>
    internal static readonly IReadOnlyDictionary<string, string[]> Reads = new Dictionary<string, string[]>(StringComparer.Ordinal)
    {
        ["$schema"] = [],
        ["id"] = [],
        ["name"] = [],
        ["rig"] = [],
        ["source"] = ["rig"],
        ["reference"] = ["rig"],
        ["meter"] = ["rig"],
        ["slots"] = ["rig", "sourceMeter"],
        ["sourceMeter"] = ["rig", "slots"],
        ["scanner"] = [],
        ["simulation"] = ["slots"],
    };

    private static LoadResult<FixtureDefinition> Finish(ParsedDefinition<FixtureDefinition> parsed, string file, ExtraCheck? extra) =>
        parsed.Finish(
            file,
            fixture =>
            {
                var problems = FixtureChecker.Check(fixture);
                extra?.Invoke(fixture, problems);
                return problems;
            },
            Reads);
}
