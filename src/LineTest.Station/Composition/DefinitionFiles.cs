using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Station.Composition;

/// <summary>
/// Reads the fixture and sequence files a command names (Core takes their bytes and does no I/O) and prints every
/// problem to the error writer. A missing or unreadable file is a problem like any other, never an exception.
/// </summary>
public static class DefinitionFiles
{
    /// <summary>Loads a fixture (with the reference-sensor check); prints problems.</summary>
    public static LoadResult<FixtureDefinition> LoadFixture(string path, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(error);
        var result = ReadFixture(path);
        Print(result.Problems, "fixture", error);
        return result;
    }

    /// <summary>Loads a sequence checked against <paramref name="fixture"/>; prints problems.</summary>
    public static LoadResult<SequenceDefinition> LoadSequence(string path, FixtureDefinition? fixture, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(error);
        var result = ReadSequence(path, fixture);
        Print(result.Problems, "sequence", error);
        return result;
    }

    /// <summary>Reads and checks a fixture file (with the reference-sensor check), printing nothing.</summary>
    public static LoadResult<FixtureDefinition> ReadFixture(string path) =>
        Read(path, out var bytes) is { } problem
            ? LoadResult<FixtureDefinition>.Failure([problem])
            : FixtureLoader.Load(path, bytes, ReferenceConversion.CheckSensor);

    /// <summary>Reads and checks a sequence file, printing nothing.</summary>
    public static LoadResult<SequenceDefinition> ReadSequence(string path, FixtureDefinition? fixture) =>
        Read(path, out var bytes) is { } problem
            ? LoadResult<SequenceDefinition>.Failure([problem])
            : SequenceLoader.Load(path, bytes, fixture);

    /// <summary>The file's bytes, or the problem that kept them from being read.</summary>
    private static DefinitionProblem? Read(string path, out byte[] bytes)
    {
        ArgumentNullException.ThrowIfNull(path);
        bytes = [];
        try
        {
            bytes = File.ReadAllBytes(path);
            return null;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            var reason = ex is FileNotFoundException or DirectoryNotFoundException
                ? "file not found"
                : $"cannot read the file: {ex.Message}";
            return new DefinitionProblem(path, null, "$", reason);
        }
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
