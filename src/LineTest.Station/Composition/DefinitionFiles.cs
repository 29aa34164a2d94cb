using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Station.Composition;

/// <summary>Loads the fixture and sequence a command names, printing every problem to the error writer.</summary>
public static class DefinitionFiles
{
    /// <summary>Loads a fixture (with the reference-sensor check); null after printing problems.</summary>
    public static LoadResult<FixtureDefinition> LoadFixture(string path, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(error);
        var result = FixtureLoader.LoadFile(path, ReferenceConversion.CheckSensor);
        Print(result.Problems, "fixture", error);
        return result;
    }

    /// <summary>Loads a sequence checked against <paramref name="fixture"/>; prints problems.</summary>
    public static LoadResult<SequenceDefinition> LoadSequence(string path, FixtureDefinition? fixture, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(error);
        var result = SequenceLoader.LoadFile(path, fixture);
        Print(result.Problems, "sequence", error);
        return result;
    }

    private static void Print(IReadOnlyList<DefinitionProblem> problems, string what, TextWriter error)
    {
        if (problems.Count == 0)
        {
            return;
        }

        error.WriteLine($"The {what} file has {problems.Count} problem{(problems.Count == 1 ? string.Empty : "s")}:");
        foreach (var problem in problems)
        {
            error.WriteLine($"  {problem}");
        }
    }
}
