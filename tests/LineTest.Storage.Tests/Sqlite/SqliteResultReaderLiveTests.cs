using LineTest.Core.Results;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteResultReaderLiveTests
{
    private static readonly DateTimeOffset Start = new(2026, 12, 3, 6, 0, 0, TimeSpan.Zero);

    [Fact]
    public async Task ReadLiveStateAsync_LastSeqAndRunsInProgress()
    {
        var directory = Some.TempDirectory();
        await using var store = SqliteResultStore.Open(directory);
        await store.AppendAsync(new RunRecordBuilder().StartedAt(Start).Build(), CancellationToken.None);
        await store.AppendAsync(new RunRecordBuilder().StartedAt(Start.AddMinutes(20)).Build(), CancellationToken.None);
        var reader = SqliteResultReader.InDirectory(directory);

        var idle = await reader.ReadLiveStateAsync();
        await store.JournalAsync([new RunRecordBuilder().StartedAt(Start.AddMinutes(40)).Build() with { Verdict = Verdict.Error }], CancellationToken.None);
        var testing = await reader.ReadLiveStateAsync();

        Assert.Equal(new LiveState(2, 0, null), idle);
        Assert.Equal(2, testing.LastSeq);
        Assert.Equal(1, testing.InProgress);
        Assert.NotNull(testing.LastProgressUtc);
    }

    [Fact]
    public async Task FindSerialsAsync_PrefixIsTakenLiterally_NotAsAPattern()
    {
        var directory = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(directory))
        {
            foreach (var serial in new[] { "AB_1", "AB_2", "ABX1", "AB%9", "AC-1", "AB_1" })
            {
                await store.AppendAsync(new RunRecordBuilder().WithSerial(serial).Build(), CancellationToken.None);
            }
        }

        var reader = SqliteResultReader.InDirectory(directory);

        Assert.Equal(["AB_1", "AB_2"], await reader.FindSerialsAsync("AB_", 10));
        Assert.Equal(["AB%9"], await reader.FindSerialsAsync("AB%", 10));
        Assert.Equal(["AB%9", "ABX1", "AB_1"], await reader.FindSerialsAsync("AB", 3));
        Assert.Empty(await reader.FindSerialsAsync("ZZ", 10));
    }

    [Fact]
    public async Task ReadHistoryAsync_EveryRunOfTheSerialInTimeOrderWithItsRecordHash()
    {
        var directory = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(directory))
        {
            // Stored out of time order: the history is ordered by when each run ended.
            await store.AppendAsync(new RunRecordBuilder().WithSerial("S-1").StartedAt(Start.AddHours(2)).Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().WithSerial("S-2").StartedAt(Start.AddHours(1)).Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().WithSerial("S-1").StartedAt(Start).Failing("verify.error", "too far").Build(), CancellationToken.None);
        }

        var history = await SqliteResultReader.InDirectory(directory).ReadHistoryAsync("S-1");

        Assert.Equal([3L, 1L], history.Select(h => h.Seq));
        Assert.Equal([Verdict.Fail, Verdict.Pass], history.Select(h => h.Run.Verdict));
        Assert.All(history, h => Assert.Matches("^[0-9a-f]{64}$", h.RecordSha256));
        Assert.NotEqual(history[0].RecordSha256, history[1].RecordSha256);
    }

    [Fact]
    public async Task ReadProductsAsync_ProductsWithTheirSequencesAndRunCounts()
    {
        var directory = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(new RunRecordBuilder().WithSequence("ctp40a-eol", 3).Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().WithSequence("ctp40a-eol", 4).Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().WithSequence("ctp40a-dac", 1).Build(), CancellationToken.None);
        }

        var products = await SqliteResultReader.InDirectory(directory).ReadProductsAsync();

        Assert.Equal([new ProductSequence("CTP-40A", "ctp40a-dac", 1), new ProductSequence("CTP-40A", "ctp40a-eol", 2)], products);
    }
}
