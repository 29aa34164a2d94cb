using LineTest.Core.Results;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteResultReaderTests
{
    private static readonly DateTimeOffset Day1 = new(2025, 3, 4, 0, 0, 0, TimeSpan.Zero);

    [Fact]
    public async Task ReadRunsAsync_NoFilter_ReturnsSummariesInInsertionOrder()
    {
        var (directory, runs) = await StoreSample();

        var summaries = await ToList(SqliteResultReader.InDirectory(directory).ReadRunsAsync());

        Assert.Equal(runs.Select(r => r.Id), summaries.Select(s => s.Id));
        Assert.Equal(Enumerable.Range(1, runs.Count).Select(i => (long)i), summaries.Select(s => s.Seq));
        var failed = summaries.Single(s => s.Verdict == Verdict.Fail);
        var source = runs.Single(r => r.Id == failed.Id);
        Assert.Equal(source.Serial, failed.Serial);
        Assert.Equal(source.EndedUtc, failed.EndedUtc);
        Assert.Equal(source.Station, failed.Station);
        Assert.Equal(source.Slot, failed.Slot);
        Assert.Equal(source.Lot, failed.Lot);
        Assert.Equal(source.SequenceId, failed.SequenceId);
        Assert.Equal(source.SequenceRevision, failed.SequenceRevision);
        Assert.Equal(source.Reason, failed.Reason);
        Assert.Equal("verify.error", failed.FirstFailingReading);
    }

    public static TheoryData<string, RunFilter, int[]> Filters => new()
    {
        // Sample: run i (0..7) ends on day 1 + i/2 at 00:14:30, station ST-0(1 + i%2), slot 1 + i%4, lot A for i < 4 else B,
        // revision 3 for i < 6 else 4.
        { "from", new RunFilter { FromUtc = Day1.AddDays(2) }, [4, 5, 6, 7] },
        { "to (exclusive)", new RunFilter { ToUtc = Day1.AddDays(1).AddMinutes(14.5) }, [0, 1] },
        { "from and to", new RunFilter { FromUtc = Day1.AddDays(1), ToUtc = Day1.AddDays(3) }, [2, 3, 4, 5] },
        { "station", new RunFilter { Station = "ST-02" }, [1, 3, 5, 7] },
        { "slot", new RunFilter { Slot = 3 }, [2, 6] },
        { "lot", new RunFilter { Lot = "LOT-B" }, [4, 5, 6, 7] },
        { "sequence id", new RunFilter { SequenceId = "ctp40a-eol" }, [0, 1, 2, 3, 4, 5, 6, 7] },
        { "unknown sequence id", new RunFilter { SequenceId = "other" }, [] },
        { "revision", new RunFilter { SequenceRevision = 4 }, [6, 7] },
        { "combined", new RunFilter { Station = "ST-01", Lot = "LOT-B", SequenceRevision = 3 }, [4] },
        { "seq range (inclusive)", new RunFilter { FirstSeq = 3, LastSeq = 5 }, [2, 3, 4] },
        { "seq range and station", new RunFilter { FirstSeq = 3, LastSeq = 6, Station = "ST-02" }, [3, 5] },
        { "seq range past the end", new RunFilter { FirstSeq = 8, LastSeq = 100 }, [7] },
    };

    [Theory]
    [MemberData(nameof(Filters))]
    public async Task ReadRunsAsync_Filter_ReturnsOnlyMatchingRuns(string what, RunFilter filter, int[] expected)
    {
        var (directory, runs) = await StoreSample();
        var reader = SqliteResultReader.InDirectory(directory);

        var summaries = await ToList(reader.ReadRunsAsync(filter));

        Assert.True(expected.Select(i => runs[i].Id).SequenceEqual(summaries.Select(s => s.Id)), what);
        Assert.Equal(expected.Length, await reader.CountRunsAsync(filter));
    }

    [Fact]
    public async Task ReadRunsAsync_SerialFilter_ReturnsEveryRunOfThatSerial()
    {
        var (directory, runs) = await StoreSample();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(new RunRecordBuilder().WithSerial(runs[2].Serial).Build(), CancellationToken.None);
        }

        var summaries = await ToList(SqliteResultReader.InDirectory(directory).ReadRunsAsync(new RunFilter { Serial = runs[2].Serial }));

        Assert.Equal(2, summaries.Count);
        Assert.All(summaries, s => Assert.Equal(runs[2].Serial, s.Serial));
    }

    [Fact]
    public async Task ReadReadingsAsync_NoFilter_ReturnsEveryReadingWithItsRunsColumns()
    {
        var (directory, runs) = await StoreSample();

        var rows = await ToList(SqliteResultReader.InDirectory(directory).ReadReadingsAsync());

        Assert.Equal(runs.Sum(r => r.Readings.Count), rows.Count);
        var expected = runs.SelectMany((run, i) => run.Readings.Select((reading, ordinal) => (run, seq: i + 1L, reading, ordinal))).ToList();
        for (var k = 0; k < rows.Count; k++)
        {
            var (run, seq, reading, ordinal) = expected[k];
            var row = rows[k];
            Assert.Equal(seq, row.RunSeq);
            Assert.Equal(run.Id, row.RunId);
            Assert.Equal(run.Serial, row.Serial);
            Assert.Equal(run.Verdict, row.RunVerdict);
            Assert.Equal(run.EndedUtc, row.EndedUtc);
            Assert.Equal(run.Station, row.Station);
            Assert.Equal(run.Slot, row.Slot);
            Assert.Equal(run.Lot, row.Lot);
            Assert.Equal(run.SequenceId, row.SequenceId);
            Assert.Equal(run.SequenceRevision, row.SequenceRevision);
            Assert.Equal(ordinal, row.Ordinal);
            Assert.Equal(reading.Name, row.Name);
            Assert.Equal(reading.Value, row.Value);
            Assert.Equal(reading.Unit, row.Unit);
            Assert.Equal(reading.Low, row.Low);
            Assert.Equal(reading.High, row.High);
            Assert.Equal(reading.Verdict, row.Verdict);
            Assert.Equal(reading.Step, row.Step);
            Assert.Equal(reading.Setpoint, row.Setpoint);
            Assert.Equal(reading.ExpandedUncertainty, row.Uncertainty);
            Assert.Equal(reading.AcceptanceLow, row.AcceptanceLow);
            Assert.Equal(reading.AcceptanceHigh, row.AcceptanceHigh);
        }
    }

    [Fact]
    public async Task ReadReadingsAsync_NamesAndStationFilter_ReturnsOnlyThoseReadingsOfThoseRuns()
    {
        var (directory, runs) = await StoreSample();
        var filter = new RunFilter { Station = "ST-01", ReadingNames = ["verify.error", "supply.current"] };

        var rows = await ToList(SqliteResultReader.InDirectory(directory).ReadReadingsAsync(filter));

        Assert.Equal(runs.Count(r => r.Station == "ST-01") * 2, rows.Count);
        Assert.All(rows, r => Assert.Equal("ST-01", r.Station));
        Assert.All(rows, r => Assert.Contains(r.Name, filter.ReadingNames));
        // Within a run, readings keep the order they were taken in.
        Assert.Equal(["supply.current", "verify.error"], rows.Take(2).Select(r => r.Name));
    }

    [Fact]
    public async Task ReadReadingsAsync_RunsWithoutReadingsBetween_KeepsEachReadingWithItsOwnRun()
    {
        var directory = Some.TempDirectory();
        var runs = new[]
        {
            new RunRecordBuilder().WithReadings().Build(),
            new RunRecordBuilder().WithSlot(2).Build(),
            new RunRecordBuilder().WithReadings().Build(),
            new RunRecordBuilder().WithReadings().Build(),
            new RunRecordBuilder().WithSlot(4).WithReadings(new Reading("late", 1.5, "V", 1, 2, Verdict.Pass)).Build(),
        };
        await using (var store = SqliteResultStore.Open(directory))
        {
            foreach (var run in runs)
            {
                await store.AppendAsync(run, CancellationToken.None);
            }
        }

        var rows = await ToList(SqliteResultReader.InDirectory(directory).ReadReadingsAsync());

        Assert.Equal(runs[1].Readings.Count + 1, rows.Count);
        Assert.All(rows.Take(runs[1].Readings.Count), r => Assert.Equal((runs[1].Id, 2L, 2), (r.RunId, r.RunSeq, r.Slot)));
        Assert.Equal((runs[4].Id, 5L, 4, "late"), (rows[^1].RunId, rows[^1].RunSeq, rows[^1].Slot, rows[^1].Name));
    }

    [Fact]
    public async Task ReadReadingsAsync_FilterMatchingNoRun_ReturnsNothing()
    {
        var (directory, _) = await StoreSample();

        Assert.Empty(await ToList(SqliteResultReader.InDirectory(directory).ReadReadingsAsync(new RunFilter { Lot = "LOT-Z" })));
    }

    [Fact]
    public async Task ReadRunsAsync_ReadingNamesOnly_IsIgnoredForRunSummaries()
    {
        var (directory, runs) = await StoreSample();

        var summaries = await ToList(SqliteResultReader.InDirectory(directory).ReadRunsAsync(new RunFilter { ReadingNames = ["no.such.reading"] }));

        Assert.Equal(runs.Count, summaries.Count);
    }

    [Fact]
    public async Task LoadRunAsync_UnknownId_ReturnsNull()
    {
        var (directory, _) = await StoreSample();

        Assert.Null(await SqliteResultReader.InDirectory(directory).LoadRunAsync(Guid.NewGuid()));
    }

    [Fact]
    public async Task ReadRunsAsync_MissingDatabase_ThrowsCannotOpenNamingThePath()
    {
        var reader = SqliteResultReader.InDirectory(Some.TempDirectory());

        var ex = await Assert.ThrowsAsync<ResultStoreException>(async () => await ToList(reader.ReadRunsAsync()));

        Assert.Equal(ResultStoreFailure.CannotOpen, ex.Failure);
        Assert.Contains(reader.DatabasePath, ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task ReadReadingsAsync_NaNValue_ReadsAsNullWhileTheStoredRunKeepsNaN()
    {
        var directory = Some.TempDirectory();
        var run = new RunRecordBuilder()
            .WithReadings(new Reading("fit.residual", double.NaN, "degC", null, 0.1, Verdict.Error) { Note = "degenerate fit" })
            .Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        var reader = SqliteResultReader.InDirectory(directory);
        var row = Assert.Single(await ToList(reader.ReadReadingsAsync()));
        var loaded = await reader.LoadRunAsync(run.Id);

        Assert.Null(row.Value);
        Assert.True(double.IsNaN(loaded!.Readings[0].Value!.Value));
    }

    internal static async Task<(string Directory, List<RunRecord> Runs)> StoreSample()
    {
        var directory = Some.TempDirectory();
        var runs = new List<RunRecord>();
        for (var i = 0; i < 8; i++)
        {
            var builder = new RunRecordBuilder()
                .StartedAt(Day1.AddDays(i / 2), TimeSpan.FromMinutes(14.5))
                .WithStation($"ST-0{1 + (i % 2)}")
                .WithSlot(1 + (i % 4))
                .WithLot(i < 4 ? "LOT-A" : "LOT-B")
                .WithSequence("ctp40a-eol", i < 6 ? 3 : 4);
            if (i == 5)
            {
                builder.Failing("verify.error", "verify.error above its upper acceptance limit");
            }

            runs.Add(builder.Build());
        }

        await using var store = SqliteResultStore.Open(directory);
        foreach (var run in runs)
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        return (directory, runs);
    }

    internal static async Task<List<T>> ToList<T>(IAsyncEnumerable<T> items)
    {
        var list = new List<T>();
        await foreach (var item in items)
        {
            list.Add(item);
        }

        return list;
    }
}
