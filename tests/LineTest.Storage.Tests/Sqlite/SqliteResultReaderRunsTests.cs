using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using LineTest.TestSupport;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteResultReaderRunsTests
{
    private static readonly DateTimeOffset Day1 = new(2025, 3, 4, 0, 0, 0, TimeSpan.Zero);

    public static TheoryData<string, RunFilter> Filters => new()
    {
        { "all", RunFilter.All },
        { "from and to", new RunFilter { FromUtc = Day1.AddDays(1), ToUtc = Day1.AddDays(3) } },
        { "station", new RunFilter { Station = "ST-02" } },
        { "slot", new RunFilter { Slot = 3 } },
        { "lot", new RunFilter { Lot = "LOT-B" } },
        { "revision", new RunFilter { SequenceRevision = 4 } },
        { "combined", new RunFilter { Station = "ST-01", Lot = "LOT-B", SequenceRevision = 3 } },
        { "nothing matches", new RunFilter { SequenceId = "other" } },
    };

    [Theory]
    [MemberData(nameof(Filters))]
    public async Task ReadRunsForReportAsync_Filter_SameSummariesAsReadRunsAsync(string what, RunFilter filter)
    {
        var (directory, runs) = await SqliteResultReaderTests.StoreSample();
        var reader = SqliteResultReader.InDirectory(directory);

        var reference = await SqliteResultReaderTests.ToList(reader.ReadRunsAsync(filter));
        var pooled = await SqliteResultReaderTests.ToList(reader.ReadRunsForReportAsync(filter));

        Assert.True(reference.SequenceEqual(pooled), what);
        Assert.All(pooled, s => Assert.Equal(runs.Single(r => r.Id == s.Id).EndedUtc, s.EndedUtc));
    }

    [Fact]
    public async Task ReadRunsForReportAsync_RepeatedStation_SharesOneStringInstance()
    {
        var (directory, _) = await SqliteResultReaderTests.StoreSample();

        var summaries = await SqliteResultReaderTests.ToList(SqliteResultReader.InDirectory(directory).ReadRunsForReportAsync());

        var st1 = summaries.Where(s => s.Station == "ST-01").ToList();
        Assert.True(st1.Count > 1);
        Assert.All(st1, s => Assert.Same(st1[0].Station, s.Station));
    }

    [Fact]
    public async Task ReadRunsForReportAsync_MissingDatabase_CannotOpen()
    {
        var reader = SqliteResultReader.InDirectory(Some.TempDirectory());

        var ex = await Assert.ThrowsAsync<ResultStoreException>(() => SqliteResultReaderTests.ToList(reader.ReadRunsForReportAsync()));

        Assert.Equal(ResultStoreFailure.CannotOpen, ex.Failure);
    }
}
