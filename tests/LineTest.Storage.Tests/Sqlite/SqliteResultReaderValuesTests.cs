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
        { "seq range", new RunFilter { FirstSeq = 3, LastSeq = 5 } },
        { "seq range, station and reading names", new RunFilter { FirstSeq = 2, LastSeq = 7, Station = "ST-01", ReadingNames = ["verify.error"] } },
        { "empty seq range", new RunFilter { FirstSeq = 5, LastSeq = 4 } },
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

    public static TheoryData<string, RunFilter, long?, long?> Ranges => new()
    {
        // Sample: eight runs, seq 1..8; station ST-0(1 + i%2) for run i, lot A for i < 4.
        { "all", RunFilter.All, 1, 8 },
        { "station", new RunFilter { Station = "ST-02" }, 2, 8 },
        { "lot", new RunFilter { Lot = "LOT-A" }, 1, 4 },
        { "seq bounds narrow further", new RunFilter { Lot = "LOT-B", LastSeq = 6 }, 5, 6 },
        { "no run matches", new RunFilter { Lot = "LOT-Z" }, null, null },
    };

    [Theory]
    [MemberData(nameof(Ranges))]
    public async Task ReadSeqRangeAsync_Filter_FirstAndLastMatchingSeq(string what, RunFilter filter, long? first, long? last)
    {
        var (directory, _) = await SqliteResultReaderTests.StoreSample();

        var range = await SqliteResultReader.InDirectory(directory).ReadSeqRangeAsync(filter);

        Assert.True(first is null ? range is null : range == new SeqRange(first.Value, last!.Value), $"{what}: {range}");
    }

    [Fact]
    public async Task ReadReadingValuesAsync_RangesSplit_TogetherGiveTheWholeScan()
    {
        var (directory, _) = await SqliteResultReaderTests.StoreSample();
        var reader = SqliteResultReader.InDirectory(directory);
        var whole = await SqliteResultReaderTests.ToList(reader.ReadReadingValuesAsync(new RunFilter { Station = "ST-01" }));

        var pieces = new List<ReadingValue>();
        foreach (var part in new SeqRange(1, 8).Split(3))
        {
            pieces.AddRange(await SqliteResultReaderTests.ToList(
                reader.ReadReadingValuesAsync(new RunFilter { Station = "ST-01", FirstSeq = part.First, LastSeq = part.Last })));
        }

        Assert.NotEmpty(whole);
        Assert.Equal(whole, pieces);
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

    // Found by `report --fuzz` on damaged databases: a page at the far end of the runs' summary index broken. The scan
    // of the matching runs reads that index from its first page on, then the filter's seq range looks up its last run
    // from the other end and meets the broken page, where SQLite says "database disk image is malformed"; that came out
    // as a bare SqliteException (a stack trace) instead of a damaged-database error.
    [Fact]
    public async Task ReadReadingValuesAsync_LastPageOfRunsIndexMalformed_DamagedDatabaseErrorNotSqliteException()
    {
        var (directory, _) = await SqliteResultReaderTests.StoreSample();
        BreakLastLeafOfRunsSummaryIndex(ResultsDatabase.PathIn(directory));
        var reader = SqliteResultReader.InDirectory(directory);

        var ex = await Record.ExceptionAsync(() => SqliteResultReaderTests.ToList(reader.ReadReadingValuesAsync(new RunFilter { Station = "ST-02" })));

        var failure = Assert.IsType<ResultStoreException>(ex);
        Assert.Equal(ResultStoreFailure.Incompatible, failure.Failure);
        Assert.Contains("is damaged", failure.Message, StringComparison.Ordinal);
    }

    private static void BreakLastLeafOfRunsSummaryIndex(string path)
    {
        long page;
        long pageSize;
        using (var connection = new Microsoft.Data.Sqlite.SqliteConnection($"Data Source={path};Pooling=False"))
        {
            connection.Open();
            using var command = connection.CreateCommand();

            // Copies of the eight runs under new seqs and ids, so the index spans many pages.
            command.CommandText = "SELECT name FROM pragma_table_info('runs') ORDER BY cid;";
            var columns = new List<string>();
            using (var names = command.ExecuteReader())
            {
                while (names.Read())
                {
                    columns.Add(names.GetString(0));
                }
            }

            var copied = columns.Select(c => c switch { "seq" => "seq + 8 * k.n", "id" => "id || '-' || k.n", _ => c });
            command.CommandText =
                $"WITH RECURSIVE k(n) AS (SELECT 1 UNION ALL SELECT n + 1 FROM k WHERE n < 200) " +
                $"INSERT INTO runs ({string.Join(", ", columns)}) SELECT {string.Join(", ", copied)} FROM runs, k;";
            command.ExecuteNonQuery();
            command.CommandText = "PRAGMA wal_checkpoint(TRUNCATE); PRAGMA journal_mode=DELETE;";
            command.ExecuteNonQuery();
            command.CommandText = "SELECT rootpage FROM sqlite_master WHERE type = 'index' AND name = 'ix_runs_summary';";
            page = (long)command.ExecuteScalar()!;
            command.CommandText = "PRAGMA page_size;";
            pageSize = (long)command.ExecuteScalar()!;
        }

        using var file = new FileStream(path, FileMode.Open, FileAccess.ReadWrite);
        var header = new byte[12];

        // Down the b-tree's right edge (SQLite file format: an interior index page, type 0x02, keeps its right-most
        // child's page number big-endian at header offset 8) to the last leaf (type 0x0A).
        while (true)
        {
            file.Position = (page - 1) * pageSize;
            file.ReadExactly(header);
            if (header[0] != 0x02)
            {
                break;
            }

            page = System.Buffers.Binary.BinaryPrimitives.ReadUInt32BigEndian(header.AsSpan(8));
        }

        Assert.Equal(0x0A, header[0]);

        // An invalid b-tree page type (0x00) in that leaf's header.
        file.Position = (page - 1) * pageSize;
        file.WriteByte(0x00);
    }
}
