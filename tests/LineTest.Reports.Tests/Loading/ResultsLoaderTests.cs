using LineTest.Core.Results;
using LineTest.Reports.Loading;
using LineTest.Reports.Tests.Support;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport.Builders;

namespace LineTest.Reports.Tests.Loading;

public sealed class ResultsLoaderTests
{
    public static TheoryData<string, ReportQuery> Queries => new()
    {
        { "all", ReportQuery.All },
        { "station (runs interleaved)", new ReportQuery { Station = "ST-02" } },
        { "lot and reading", new ReportQuery { Lot = "LOT-B", ReadingNames = ["verify.error"] } },
        { "no run matches", new ReportQuery { Lot = "LOT-Z" } },
    };

    [Theory]
    [MemberData(nameof(Queries))]
    public async Task LoadAsync_ReadingsInSeveralRanges_SameDataAsOneScan(string what, ReportQuery query)
    {
        var directory = await Synthetic.CreateAsync(runs: 90, seed: 11);
        await AppendRevisionAsync(directory);

        var one = await ResultsLoader.LoadAsync([directory], query, parts: 1);
        foreach (var parts in new[] { 2, 3, 7, 200 })
        {
            var split = await ResultsLoader.LoadAsync([directory], query, parts);
            AssertSame(one, split, $"{what}, {parts} ranges");
        }
    }

    [Fact]
    public async Task LoadAsync_LimitChangeAndMissingValue_KeptWhenSplit()
    {
        var directory = await Synthetic.CreateAsync(runs: 12, seed: 3);
        await AppendRevisionAsync(directory);

        var data = await ResultsLoader.LoadAsync([directory], ReportQuery.All, parts: 5);

        var error = data.Readings.Single(r => r.Name == "verify.error");
        Assert.True(error.LimitsChanged);
        Assert.Equal((-0.2, 0.2), (error.Low, error.High));
        Assert.Equal(1, error.Missing);
        Assert.Equal(13, error.Count);
    }

    [Fact]
    public async Task LoadAsync_SkipDamagedRuns_LeavesOutEachDamagedRunWithItsReadingsAndNamesIt()
    {
        // A damaged run (seq 3: verdict) and a run with one damaged reading (seq 7: infinite value): both left out whole,
        // split over ranges or not, so yield and readings describe the same runs.
        var directory = await Synthetic.CreateAsync(runs: 12, seed: 3);
        var sound = await ResultsLoader.LoadAsync([directory], ReportQuery.All, parts: 1);
        Damage(directory, "UPDATE runs SET verdict = 'maybe' WHERE seq = 3; UPDATE readings SET value = 9e999 WHERE run_seq = 7 AND ordinal = 0;");

        await Assert.ThrowsAsync<LineTest.Storage.Store.ResultStoreException>(() => ResultsLoader.LoadAsync([directory], ReportQuery.All));
        var data = await ResultsLoader.LoadAsync([directory], ReportQuery.All, skipDamagedRuns: true);

        Assert.Equal(sound.Runs.Count - 2, data.Runs.Count);
        Assert.Equal(2, data.SkippedRows.Count);
        Assert.StartsWith("seq 3: ", data.SkippedRows[0], StringComparison.Ordinal);
        Assert.Contains("maybe", data.SkippedRows[0], StringComparison.Ordinal);
        Assert.StartsWith("seq 7: ", data.SkippedRows[1], StringComparison.Ordinal);
        Assert.Contains("not a finite number", data.SkippedRows[1], StringComparison.Ordinal);
        Assert.Equal(sound.Readings.Sum(r => r.Count) - ReadingsOf(sound, 2) - ReadingsOf(sound, 6), data.Readings.Sum(r => r.Count));
    }

    private static int ReadingsOf(ReportData data, int run) => data.Readings.Sum(r => r.Runs.Count(run));

    private static void Damage(string directory, string sql)
    {
        using var connection = new Microsoft.Data.Sqlite.SqliteConnection($"Data Source={Path.Combine(directory, "results.db")};Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA ignore_check_constraints = ON; " + sql;
        command.ExecuteNonQuery();
    }

    // Two runs of a later revision: tighter verify limits and one verify without a value.
    private static async Task AppendRevisionAsync(string directory)
    {
        await using var store = SqliteResultStore.Open(directory);
        var start = new DateTimeOffset(2025, 3, 9, 6, 0, 0, TimeSpan.Zero);
        for (var i = 0; i < 2; i++)
        {
            var record = new RunRecordBuilder()
                .WithSerial($"CTP40-R{i:D4}")
                .WithSlot(i + 1)
                .WithStation("ST-02")
                .WithLot("LOT-B")
                .StartedAt(start.AddMinutes(i * 9), TimeSpan.FromMinutes(8))
                .WithReadings(
                    new Reading("cold.output", 0.74, "V", 0.70, 0.75, Verdict.Pass),
                    new Reading("verify.error", i == 0 ? 0.01 : null, "degC", -0.2, 0.2, i == 0 ? Verdict.Pass : Verdict.Error))
                .Build();
            await store.AppendAsync(record, CancellationToken.None);
        }
    }

    private static void AssertSame(ReportData expected, ReportData actual, string what)
    {
        Assert.True(expected.Runs.Count == actual.Runs.Count, $"{what}: run count");
        for (var i = 0; i < expected.Runs.Count; i++)
        {
            Assert.True(
                (expected.Runs.Serial(i), expected.Runs.Verdict(i), expected.Runs.EndedUtc(i))
                == (actual.Runs.Serial(i), actual.Runs.Verdict(i), actual.Runs.EndedUtc(i)),
                $"{what}: run {i}");
        }

        Assert.Equal(expected.Readings.Select(r => r.Name), actual.Readings.Select(r => r.Name));
        foreach (var (e, a) in expected.Readings.Zip(actual.Readings))
        {
            Assert.True(e.Values.SequenceEqual(a.Values), $"{what}: values of {e.Name}");
            Assert.True(e.Runs.SequenceEqual(a.Runs), $"{what}: runs of {e.Name}");
            Assert.True(
                (e.Unit, e.Low, e.High, e.LimitsChanged, e.Missing) == (a.Unit, a.Low, a.High, a.LimitsChanged, a.Missing),
                $"{what}: unit, limits or missing of {e.Name}");
        }
    }
}
