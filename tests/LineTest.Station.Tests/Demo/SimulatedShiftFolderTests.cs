using LineTest.Core.Results;
using LineTest.Reports.Building;
using LineTest.Reports.Loading;
using LineTest.Station.Composition;
using LineTest.Station.Demo;
using LineTest.TestSupport;
using Microsoft.Extensions.Logging.Abstractions;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Station.Tests.Demo;

/// <summary>Two demo shifts into one folder behave like two shifts of one factory.</summary>
public sealed class SimulatedShiftFolderTests
{
    [Fact]
    public async Task RunAsync_TwoShiftsIntoOneFolder_ContinueSerialsAndTimeSoTheReportPoolsThem()
    {
        var fixture = DefinitionFiles.LoadFixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"), TextWriter.Null).Value!;
        var sequence = DefinitionFiles.LoadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture, TextWriter.Null);
        var results = Some.TempDirectory();
        var clock = new FakeTimeProvider(new DateTimeOffset(2026, 3, 4, 6, 0, 0, TimeSpan.Zero));

        async Task<(ShiftSummary Summary, List<RunRecord> Runs, SimulatedShift Shift)> ShiftAsync(int seed, int units)
        {
            var runs = new List<RunRecord>();
            var shift = new SimulatedShift(
                new ShiftOptions
                {
                    Fixture = fixture,
                    Sequence = sequence.Value!,
                    SequenceSha256 = sequence.Sha256!,
                    Units = units,
                    Seed = seed,
                    ResultsDirectory = results,
                    Clock = clock,
                },
                NullLoggerFactory.Instance);
            var summary = await shift.RunAsync(runs.Add, CancellationToken.None);
            return (summary, runs, shift);
        }

        // Back to back, as a person would type them: the first shift starts a week back, so the second fits after it.
        var first = await ShiftAsync(seed: 3, units: 10);
        var firstNow = clock.GetUtcNow();
        clock.Advance(TimeSpan.FromSeconds(5));
        var second = await ShiftAsync(seed: 4, units: 8);

        // Serials continue; the second shift starts after the first one's last run; nothing ends after "now".
        Assert.Equal("CTP40A-2612-000001", first.Runs.OrderBy(r => r.Serial, StringComparer.Ordinal).First().Serial);
        Assert.Equal("CTP40A-2612-000011", second.Runs.OrderBy(r => r.Serial, StringComparer.Ordinal).First().Serial);
        Assert.True(second.Runs.Min(r => r.StartedUtc) > first.Runs.Max(r => r.EndedUtc));
        Assert.All(first.Runs, r => Assert.True(r.EndedUtc <= firstNow, $"{r.Serial} ends {r.EndedUtc:O}, after {firstNow:O}"));
        Assert.All(second.Runs, r => Assert.True(r.EndedUtc <= clock.GetUtcNow()));

        // The report made now sees both shifts: units add up, first-pass yield is the pooled figure.
        var data = await ResultsLoader.LoadAsync([results], ReportQuery.All);
        var report = ReportBuilder.Build(data, ReportQuery.All, clock);
        Assert.Equal(first.Summary.Units + second.Summary.Units, report.Yield.Units);
        Assert.Equal(report.Yield.Units, report.Yield.Runs);
        var pooled = (double)(first.Summary.Pass + second.Summary.Pass) / (first.Summary.Units + second.Summary.Units);
        Assert.Equal(pooled, report.Yield.FirstPassYield!.Value, 12);
        for (var i = 0; i < data.Runs.Count; i++)
        {
            Assert.True(data.Runs.EndedUtc(i) <= report.GeneratedUtc);
        }
    }

    [Fact]
    public async Task RunAsync_ShiftThatCannotEndBeforeNow_IsNotRunAndSaysWhy()
    {
        var fixture = DefinitionFiles.LoadFixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"), TextWriter.Null).Value!;
        var sequence = DefinitionFiles.LoadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture, TextWriter.Null);
        var results = Some.TempDirectory();
        var clock = new FakeTimeProvider(new DateTimeOffset(2026, 3, 4, 6, 0, 0, TimeSpan.Zero));
        SimulatedShift Shift(int seed, TimeProvider now) => new(
            new ShiftOptions
            {
                Fixture = fixture,
                Sequence = sequence.Value!,
                SequenceSha256 = sequence.Sha256!,
                Units = 4,
                Seed = seed,
                ResultsDirectory = results,
                Clock = now,
            },
            NullLoggerFactory.Instance);

        var first = new List<RunRecord>();
        await Shift(1, clock).RunAsync(first.Add, CancellationToken.None);

        // "Now" ten minutes after the last stored run: a shift of one batch (about half an hour) cannot fit.
        var stored = new List<RunRecord>();
        var second = Shift(2, new FakeTimeProvider(first.Max(r => r.EndedUtc) + TimeSpan.FromMinutes(10)));
        var summary = await second.RunAsync(stored.Add, CancellationToken.None);

        Assert.Empty(stored);
        Assert.Equal(0, summary.Units);
        Assert.Contains("in the future", second.Unplaced, StringComparison.Ordinal);
    }

    [Fact]
    public async Task RunAsync_FirstSerialAndStation_AreStored()
    {
        var fixture = DefinitionFiles.LoadFixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"), TextWriter.Null).Value!;
        var sequence = DefinitionFiles.LoadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture, TextWriter.Null);
        var runs = new List<RunRecord>();
        var shift = new SimulatedShift(
            new ShiftOptions
            {
                Fixture = fixture,
                Sequence = sequence.Value!,
                SequenceSha256 = sequence.Sha256!,
                Units = 2,
                ResultsDirectory = Some.TempDirectory(),
                Station = "ST-07",
                Lot = "LOT-9",
                FirstSerial = 500,
                Clock = new FakeTimeProvider(new DateTimeOffset(2026, 3, 4, 6, 0, 0, TimeSpan.Zero)),
            },
            NullLoggerFactory.Instance);

        await shift.RunAsync(runs.Add, CancellationToken.None);

        Assert.Equal(["CTP40A-2612-000500", "CTP40A-2612-000501"], runs.Select(r => r.Serial).Order(StringComparer.Ordinal));
        Assert.All(runs, r => Assert.Equal(("ST-07", "LOT-9"), (r.Station, r.Lot)));
    }

    private static (Core.Fixtures.FixtureDefinition Fixture, Core.Definitions.LoadResult<Core.Sequences.SequenceDefinition> Sequence) Definitions()
    {
        var fixture = DefinitionFiles.LoadFixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"), TextWriter.Null).Value!;
        return (fixture, DefinitionFiles.LoadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture, TextWriter.Null));
    }

    // Regression: an empty folder's first shift always started at 06:00 UTC a week back, so a second or third long shift
    // (two 300-unit demos take about 35 h each) found no room before now and was refused. Here each shift takes about
    // 61 h (three batches with the operator away 30 h between them), so three do not fit in a week.
    [Fact]
    public async Task RunAsync_ThreeLongShiftsIntoAnEmptyFolder_AllFitBeforeNowOneAfterTheOther()
    {
        var (fixture, sequence) = Definitions();
        var results = Some.TempDirectory();
        var clock = new FakeTimeProvider(new DateTimeOffset(2026, 3, 4, 6, 0, 0, TimeSpan.Zero));
        var shifts = new List<(SimulatedShift Shift, ShiftSummary Summary, List<RunRecord> Runs, DateTimeOffset Now)>();
        for (var seed = 1; seed <= 3; seed++)
        {
            var runs = new List<RunRecord>();
            var shift = new SimulatedShift(
                new ShiftOptions
                {
                    Fixture = fixture, Sequence = sequence.Value!, SequenceSha256 = sequence.Sha256!, Units = 12, Seed = seed,
                    ResultsDirectory = results, Clock = clock, ReloadSeconds = 30 * 3600,
                },
                NullLoggerFactory.Instance);
            var summary = await shift.RunAsync(runs.Add, CancellationToken.None);
            shifts.Add((shift, summary, runs, clock.GetUtcNow()));
            clock.Advance(TimeSpan.FromSeconds(5));
        }

        Assert.All(shifts, s => Assert.True(s.Shift.Unplaced is null && s.Shift.Stopped is null, s.Shift.Unplaced ?? s.Shift.Stopped));
        Assert.All(shifts, s => Assert.Equal(12, s.Summary.Units));
        Assert.True(shifts[0].Summary.SimulatedSeconds > 60 * 3600, $"a shift took only {shifts[0].Summary.SimulatedSeconds} s");
        for (var k = 0; k < shifts.Count; k++)
        {
            Assert.All(shifts[k].Runs, r => Assert.True(r.EndedUtc <= shifts[k].Now, $"{r.Serial} ends {r.EndedUtc:O}, after {shifts[k].Now:O}"));
            Assert.Equal($"CTP40A-2612-{(12 * k) + 1:D6}", shifts[k].Runs.Min(r => r.Serial));
            if (k > 0)
            {
                Assert.True(shifts[k].Runs.Min(r => r.StartedUtc) > shifts[k - 1].Runs.Max(r => r.EndedUtc));
            }
        }
    }

    // Regression: a demo simulated its whole shift twice (first unstored, to learn its length), doubling its wall time.
    // Now one defect-free batch plans it, and its plan is not shorter than the shift it planned.
    [Fact]
    public async Task RunAsync_Shift_SimulatesEachBatchOnceAfterOnePlanningBatch()
    {
        var (fixture, sequence) = Definitions();
        var shift = new SimulatedShift(
            new ShiftOptions
            {
                Fixture = fixture, Sequence = sequence.Value!, SequenceSha256 = sequence.Sha256!, Units = 10, Seed = 7,
                ResultsDirectory = Some.TempDirectory(), Clock = new FakeTimeProvider(new DateTimeOffset(2026, 3, 4, 6, 0, 0, TimeSpan.Zero)),
            },
            NullLoggerFactory.Instance);

        var summary = await shift.RunAsync(_ => { }, CancellationToken.None);

        Assert.Equal(10, summary.Units);
        Assert.Equal(1 + 3, shift.BatchesSimulated);
        Assert.True(shift.Plan!.Length >= TimeSpan.FromSeconds(summary.SimulatedSeconds), $"planned {shift.Plan.Length}, took {summary.SimulatedSeconds} s");
    }
}
