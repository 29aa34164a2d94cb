using System.Diagnostics;
using CsCheck;
using LineTest.Station.Campaign;
using LineTest.Station.Tests.Cli;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Campaign;

/// <summary>
/// Fuzzing of sequence and fixture files through the real command line: damaged copies of the shipped files (flipped
/// bytes, cuts, junk, values of the wrong type or range, removed keys) must end <c>check</c> and <c>dry-run</c> with exit
/// code 0, 1 or 2, a message and no stack trace, within 10 s. Bounded to a few seconds each; the large run is
/// <c>linetest campaign --fuzz-files N</c> (docs/reliability.md).
/// </summary>
[Trait("Category", "Fuzz")]
public sealed class DefinitionMutatorTests
{
    private static readonly string[] Sequences = ["sequences/ctp40a-dac.json", "sequences/ctp40r-resistor.json", "sequences/ctp40d-firmware.json"];

    private static readonly string[] Fixtures = ["fixtures/sim-dryblock-4.json", "fixtures/rig-dryblock-4.json"];

    /// <summary>A damaged copy of a shipped file: which file, and the seed of one to three mutations.</summary>
    private static readonly Gen<(string File, bool IsSequence, int Seed, int Rounds)> Damaged =
        Gen.Select(Gen.Bool, Gen.Int[0, 4], Gen.Int, Gen.Int[1, 3])
            .Select((isSequence, pick, seed, rounds) => (isSequence ? Sequences[pick % Sequences.Length] : Fixtures[pick % Fixtures.Length], isSequence, seed, rounds));

    [Fact]
    public void Check_DamagedSequenceOrFixture_EndsWithACodeAndNoStackTrace() =>
        Damaged.Sample(input => AssertEndsCleanly(input, "check"), iter: 150, threads: 1);

    [Fact]
    public void DryRun_DamagedSequenceOrFixture_EndsWithACodeAndNoStackTrace() =>
        Damaged.Sample(input => AssertEndsCleanly(input, "dry-run"), iter: 8, threads: 1);

    [Fact]
    public void Mutate_SameSeed_SameDamage()
    {
        var original = File.ReadAllBytes(RepoFiles.Path(Sequences[0]));

        Assert.Equal(new DefinitionMutator(7).Mutate(original), new DefinitionMutator(7).Mutate(original));
    }

    private static void AssertEndsCleanly((string File, bool IsSequence, int Seed, int Rounds) input, string command)
    {
        var mutator = new DefinitionMutator(input.Seed);
        var bytes = File.ReadAllBytes(RepoFiles.Path(input.File));
        for (var i = 0; i < input.Rounds; i++)
        {
            bytes = mutator.Mutate(bytes);
        }

        var path = Path.Combine(Some.TempDirectory(), Path.GetFileName(input.File));
        File.WriteAllBytes(path, bytes);
        var sequence = input.IsSequence ? path : RepoFiles.Path(Sequences[0]);
        var fixture = input.IsSequence ? RepoFiles.Path(Fixtures[0]) : path;
        var clock = Stopwatch.StartNew();

        var (exit, output, error) = CliRunner.RunAsync(command, sequence, "--fixture", fixture).GetAwaiter().GetResult();

        Assert.True(exit is 0 or 1 or 2, $"{input}: exit {exit}\n{error}");
        Assert.DoesNotContain("   at ", error + output, StringComparison.Ordinal);
        Assert.DoesNotContain("Exception", error + output, StringComparison.Ordinal);
        Assert.True(clock.Elapsed < TimeSpan.FromSeconds(10), $"{input}: {clock.Elapsed.TotalSeconds:F1} s");
    }
}
