using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using LineTest.TestSupport;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteResultReaderValuesTests
{
    private static readonly DateTimeOffset Day1 = new(2025, 3, 4, 0, 0, 0, TimeSpan.Zero);

    public static TheoryData<string, RunFilter> Filters => new()
    {
        { "all", RunFilter.All },
        { "from", new RunFilter { FromUtc = Day1.AddDays(2) } },
        { "station (runs interleaved within the seq range)", new RunFilter { Station = "ST-02" } },
        { "slot", new RunFilter { Slot = 3 } },
        { "combined", new RunFilter { Station = "ST-01", Lot = "LOT-B", SequenceRevision = 3 } },
        { "reading names", new RunFilter { ReadingNames = ["verify.error", "supply.current"] } },
        { "station and reading names", new RunFilter { Station = "ST-01", ReadingNames = ["verify.error"] } },
        { "no run matches", new RunFilter { Lot = "LOT-Z" } },
        { "no reading matches", new RunFilter { ReadingNames = ["no.such.reading"] } },
    };

    [Theory]
    [MemberData(nameof(Filters))]
    public async Task ReadReadingValuesAsync_Filter_SameReadingsAsTheFullScan(string what, RunFilter filter)
    {
        var (directory, _) = await SqliteResultReaderTests.StoreSample();
        var reader = SqliteResultReader.InDirectory(directory);

        var full = await SqliteResultReaderTests.ToList(reader.ReadReadingsAsync(filter));
        var narrow = await SqliteResultReaderTests.ToList(reader.ReadReadingValuesAsync(filter));

        // The full scan is the reference: the narrow one must give the same readings, in the same order.
        var expected = full.Select(r => new ReadingValue(r.RunSeq, r.Name, r.Value, r.Unit, r.Low, r.High)).ToList();
        Assert.True(expected.SequenceEqual(narrow), what);
    }

    [Fact]
    public async Task ReadReadingValuesAsync_RepeatedNames_ShareOneStringInstance()
    {
        var (directory, _) = await SqliteResultReaderTests.StoreSample();

        var values = await SqliteResultReaderTests.ToList(SqliteResultReader.InDirectory(directory).ReadReadingValuesAsync());

        var errors = values.Where(v => v.Name == "verify.error").ToList();
        Assert.True(errors.Count > 1);
        Assert.All(errors, v => Assert.Same(errors[0].Name, v.Name));
        Assert.All(errors, v => Assert.Same(errors[0].Unit, v.Unit));
    }

    [Fact]
    public async Task ReadReadingValuesAsync_MissingDatabase_CannotOpen()
    {
        var reader = SqliteResultReader.InDirectory(Some.TempDirectory());

        var ex = await Assert.ThrowsAsync<ResultStoreException>(() => SqliteResultReaderTests.ToList(reader.ReadReadingValuesAsync()));

        Assert.Equal(ResultStoreFailure.CannotOpen, ex.Failure);
    }
}
