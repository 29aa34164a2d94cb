using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.TestSupport;

/// <summary>Loads a sequence or fixture file for a test: the test reads the bytes, Core checks them (Core does no I/O).</summary>
public static class DefinitionFile
{
    /// <summary>Reads and checks the fixture at <paramref name="path"/>.</summary>
    public static LoadResult<FixtureDefinition> Fixture(string path, FixtureLoader.ExtraCheck? extra = null) =>
        FixtureLoader.Load(path, File.ReadAllBytes(path), extra);

    /// <summary>Reads and checks the sequence at <paramref name="path"/>, against a fixture when one is given.</summary>
    public static LoadResult<SequenceDefinition> Sequence(string path, FixtureDefinition? fixture = null) =>
        SequenceLoader.Load(path, File.ReadAllBytes(path), fixture);
}
