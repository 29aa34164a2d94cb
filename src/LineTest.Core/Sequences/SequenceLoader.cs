using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;

namespace LineTest.Core.Sequences;

/// <summary>Loads a sequence from its file's bytes (the Station reads the file): parse, then check (optionally against a fixture), reporting every problem with its location.</summary>
public static class SequenceLoader
{
    /// <summary>Loads and checks a sequence from bytes (named <paramref name="file"/> in problems).</summary>
    public static LoadResult<SequenceDefinition> Load(string file, byte[] utf8, FixtureDefinition? fixture = null) =>
        Finish(JsonDefinitionReader.Parse<SequenceDefinition>(file, utf8), file, fixture);

    /// <summary>
    /// Which top-level keys the checks that report under each key read (<see cref="DependentProblems"/>), from
    /// <see cref="SequenceChecker"/> and the rules it calls: a file with a broken part still gets every problem that
    /// does not depend on it. The steps read the setpoints, the trim, the sweep bias and (kept on the safe side) every
    /// setting of the process, and the steps before them; not the header (id, revision, product, serials, dispositions).
    /// </summary>
    internal static readonly IReadOnlyDictionary<string, string[]> Reads = new Dictionary<string, string[]>(StringComparer.Ordinal)
    {
        ["$schema"] = [],
        ["id"] = [],
        ["revision"] = [],
        ["product"] = [],
        ["description"] = [],
        ["serialPattern"] = [],
        ["serialExample"] = ["serialPattern"],
        ["dispositions"] = [],
        ["stability"] = [],
        ["soak"] = ["trim"],
        ["settle"] = ["stability"],
        ["setpoints"] = ["stability"],
        ["trim"] = ["ratedRange"],
        ["ratedRange"] = [],
        ["nominalBiasAmps"] = [],
        ["stopOnFail"] = [],
        ["setpointOrder"] = [],
        ["steps"] = ["setpoints", "trim", "nominalBiasAmps", "ratedRange", "stability", "soak", "settle", "setpointOrder", "stopOnFail"],
    };

    private static LoadResult<SequenceDefinition> Finish(ParsedDefinition<SequenceDefinition> parsed, string file, FixtureDefinition? fixture) =>
        parsed.Finish(file, sequence => SequenceChecker.Check(sequence, fixture), Reads);
}
