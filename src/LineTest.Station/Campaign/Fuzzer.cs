using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Rig.Fuzzing;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;

namespace LineTest.Station.Campaign;

/// <summary>
/// Fuzzing: damaged sequence and fixture files must give problems with a location (or load), never an exception;
/// instruments that reply with garbage must never crash the coordinator: every unit ends pass, fail or error.
/// </summary>
/// <param name="fixture">A good simulator fixture (for the garbage batches and to check damaged sequences against).</param>
/// <param name="fixtureBytes">Its file's bytes (what is damaged).</param>
/// <param name="sequence">A good sequence.</param>
/// <param name="sequenceBytes">Its file's bytes.</param>
/// <param name="sequenceSha256">Its hash.</param>
/// <param name="seed">Seed of every random draw.</param>
public sealed class Fuzzer(FixtureDefinition fixture, byte[] fixtureBytes, SequenceDefinition sequence, byte[] sequenceBytes, string sequenceSha256, int seed)
{
    private const int CrashesKept = 10;

    /// <summary>Runs <paramref name="loaderCases"/> damaged files and <paramref name="garbageBatches"/> batches on garbage instruments.</summary>
    public async Task<FuzzSummary> RunAsync(int loaderCases, int garbageBatches, CancellationToken cancellationToken)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(loaderCases);
        ArgumentOutOfRangeException.ThrowIfNegative(garbageBatches);
        var wallStart = TimeProvider.System.GetTimestamp();
        var crashes = new List<string>();
        var mutator = new DefinitionMutator(seed);
        int loaded = 0, refused = 0, loaderCrashes = 0, unlocated = 0;
        for (var i = 0; i < loaderCases; i++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var isSequence = i % 2 == 0;
            var bytes = mutator.Mutate(isSequence ? sequenceBytes : fixtureBytes);
            try
            {
                IReadOnlyList<DefinitionProblem> problems = isSequence
                    ? SequenceLoader.Load("fuzz-sequence.json", bytes, fixture).Problems
                    : FixtureLoader.Load("fuzz-fixture.json", bytes, ReferenceConversion.CheckSensor).Problems;
                if (problems.Count == 0)
                {
                    loaded++;
                }
                else
                {
                    refused++;
                    unlocated += problems.Count(p => !(p.Line is > 0 || p.JsonPath.StartsWith('$')));
                }
            }
            catch (Exception ex)
            {
                loaderCrashes++;
                Keep(crashes, $"loader case {i} ({(isSequence ? "sequence" : "fixture")}): {ex.GetType().Name}: {ex.Message} {Where(ex)}");
            }
        }

        int units = 0, pass = 0, fail = 0, error = 0, unhandled = 0, noVerdict = 0, wrong = 0, replies = 0, trimmed = 0, verified = 0;
        var trimSteps = sequence.Steps.OfType<TrimStep>().Select(s => s.DisplayName).ToHashSet(StringComparer.Ordinal);
        var verifySteps = sequence.Steps.OfType<VerifyStep>().Select(s => s.DisplayName).ToHashSet(StringComparer.Ordinal);
        for (var b = 0; b < garbageBatches; b++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var batchSeed = unchecked(seed + (b * 104729));
            var rates = new Random(batchSeed);
            var clock = new VirtualTimeProvider(new DateTimeOffset(2026, 3, 16, 6, 0, 0, TimeSpan.Zero));
            var station = SimulatedStation.Create(fixture, sequence.Product, batchSeed, clock);

            // Rates spread evenly in log from 1 in 10 000 to 1 in 10 replies: a batch makes a thousand or more instrument
            // calls, so at the high end the first garbage ends it early, and only the low end lets batches get through
            // trim and verify with a garbage reply or two on the way.
            var garbage = new GarbageInstruments(station.Rig.Instruments, batchSeed, 1e-4 * Math.Pow(1e3, rates.NextDouble()));
            var sink = new CollectingSink();
            var coordinator = station.Coordinator(sink, instruments: garbage.Instruments);
            var batchUnits = station.LoadUnits(fixture.Slots.Select(s => s.Slot).Order());
            var loads = batchUnits.Select(l => l.Load).ToList();
            var byserial = batchUnits.ToDictionary(l => l.Unit.Serial, l => l.Unit, StringComparer.Ordinal);

            units += loads.Count;
            try
            {
                var outcome = await coordinator.RunAsync(
                    new BatchRequest { Sequence = sequence, SequenceSha256 = sequenceSha256, Station = "FUZZ", Loads = loads }, cancellationToken)
                    .ConfigureAwait(false);
                noVerdict += loads.Count - outcome.Runs.Count(r => r.Verdict is Verdict.Pass or Verdict.Fail or Verdict.Error);
                noVerdict += loads.Count(l => sink.Runs.Count(r => r.Serial == l.Serial) != 1);
                foreach (var run in outcome.Runs)
                {
                    pass += run.Verdict == Verdict.Pass ? 1 : 0;
                    fail += run.Verdict == Verdict.Fail ? 1 : 0;
                    error += run.Verdict == Verdict.Error ? 1 : 0;
                    wrong += run.Verdict == Verdict.Pass && FaultCampaign.TrulyOutOfLimits(byserial[run.Serial], sequence) ? 1 : 0;
                    trimmed += run.Readings.Any(r => r.Step is { } step && trimSteps.Contains(step)) ? 1 : 0;
                    verified += run.Readings.Any(r => r.Step is { } step && verifySteps.Contains(step)) ? 1 : 0;
                }
            }
            catch (Exception ex) when (ex is not OperationCanceledException || !cancellationToken.IsCancellationRequested)
            {
                unhandled++;
                noVerdict += loads.Count - sink.Runs.Count;
                Keep(crashes, $"garbage batch {b} (seed {batchSeed}): {ex.GetType().Name}: {ex.Message} {Where(ex)}");
            }

            replies += garbage.GarbageReplies;
        }

        return new FuzzSummary
        {
            LoaderCases = loaderCases,
            Loaded = loaded,
            Refused = refused,
            LoaderCrashes = loaderCrashes,
            ProblemsWithoutLocation = unlocated,
            GarbageBatches = garbageBatches,
            GarbageReplies = replies,
            Units = units,
            Pass = pass,
            Fail = fail,
            Error = error,
            UnhandledInBatches = unhandled,
            UnitsWithoutVerdict = noVerdict,
            WrongPasses = wrong,
            ReachedTrim = trimmed,
            ReachedVerify = verified,
            FirstCrashes = crashes,
            WallSeconds = TimeProvider.System.GetElapsedTime(wallStart).TotalSeconds,
        };
    }

    /// <summary>The innermost frames of the stack, for the bug report.</summary>
    private static string Where(Exception ex) =>
        string.Join(" <- ", (ex.StackTrace ?? string.Empty).Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries).Take(3));

    private static void Keep(List<string> crashes, string message)
    {
        if (crashes.Count < CrashesKept)
        {
            crashes.Add(message);
        }
    }
}
