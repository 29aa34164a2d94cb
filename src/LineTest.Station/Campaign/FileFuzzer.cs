using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Station.Composition;

namespace LineTest.Station.Campaign;

/// <summary>
/// Fuzzing of definition files: N damaged copies of a good sequence and N of a good fixture go through exactly what
/// <c>check --fixture</c> runs (the strict scan, the shape check, the bounds, the semantic checks, the reference-sensor
/// check); each must give problems or load, never throw, and finish within 10 s. One to three mutations per copy.
/// </summary>
/// <param name="fixture">The good fixture sequences are checked against.</param>
/// <param name="fixtureBytes">Its file's bytes (what is damaged).</param>
/// <param name="sequenceBytes">A good sequence file's bytes.</param>
/// <param name="seed">Seed of every mutation.</param>
public sealed class FileFuzzer(FixtureDefinition fixture, byte[] fixtureBytes, byte[] sequenceBytes, int seed)
{
    private const int CrashesKept = 10;

    /// <summary>Checks <paramref name="count"/> damaged sequences and <paramref name="count"/> damaged fixtures.</summary>
    public FileFuzzSummary Run(int count, CancellationToken cancellationToken)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(count);
        var wallStart = TimeProvider.System.GetTimestamp();
        var mutator = new DefinitionMutator(seed);
        var rounds = new Random(seed);
        var crashes = new List<string>();
        int loaded = 0, refused = 0, crashed = 0, slow = 0;
        var slowest = 0.0;
        for (var i = 0; i < 2 * count; i++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var isSequence = i % 2 == 0;
            var bytes = isSequence ? sequenceBytes : fixtureBytes;
            for (var r = 1 + rounds.Next(3); r > 0; r--)
            {
                bytes = mutator.Mutate(bytes);
            }

            var start = TimeProvider.System.GetTimestamp();
            try
            {
                IReadOnlyList<DefinitionProblem> problems = isSequence
                    ? SequenceLoader.Load("fuzz-sequence.json", bytes, fixture).Problems
                    : FixtureLoader.Load("fuzz-fixture.json", bytes, ReferenceConversion.CheckSensor).Problems;
                loaded += problems.Count == 0 ? 1 : 0;
                refused += problems.Count == 0 ? 0 : 1;
            }
            catch (Exception ex)
            {
                crashed++;
                if (crashes.Count < CrashesKept)
                {
                    crashes.Add($"case {i} ({(isSequence ? "sequence" : "fixture")}): {ex.GetType().Name}: {ex.Message}");
                }
            }

            var ms = TimeProvider.System.GetElapsedTime(start).TotalMilliseconds;
            slowest = Math.Max(slowest, ms);
            slow += ms > 10_000 ? 1 : 0;
        }

        return new FileFuzzSummary
        {
            Sequences = count,
            Fixtures = count,
            Loaded = loaded,
            Refused = refused,
            Crashes = crashed,
            OverTenSeconds = slow,
            SlowestMilliseconds = slowest,
            FirstCrashes = crashes,
            WallSeconds = TimeProvider.System.GetElapsedTime(wallStart).TotalSeconds,
        };
    }
}
