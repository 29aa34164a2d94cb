using LineTest.Core.Results;
using LineTest.Storage.History;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Storage.Tests.History;

public sealed class SerialHistoryReaderTests
{
    [Fact]
    public async Task ReadAsync_NoDatabaseYet_IsEmpty()
    {
        var reader = new SerialHistoryReader(Some.TempDirectory());

        Assert.Empty(await reader.ReadAsync("CTP40A-2612-000001", CancellationToken.None));
    }

    [Fact]
    public async Task ReadAsync_RunsOfTheSerial_InStoredOrderWithReasonReadingAndDisposition()
    {
        var directory = Some.TempDirectory();
        var failed = new RunRecordBuilder().WithSerial("CTP40A-2612-000001").WithSlot(3)
            .Failing("verify.error", "verify.error: 0.61 degC is above the acceptance limit").Build()
            with { Disposition = "retest rack" };
        var passed = new RunRecordBuilder().WithSerial("CTP40A-2612-000001").WithSlot(1).Build() with { Disposition = "packing tray" };
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(failed, CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().WithSerial("CTP40A-2612-000002").Build(), CancellationToken.None);
            await store.AppendAsync(passed, CancellationToken.None);
        }

        var runs = await new SerialHistoryReader(directory).ReadAsync(" CTP40A-2612-000001 ", CancellationToken.None);

        Assert.Equal(2, runs.Count);
        Assert.Equal((3, Verdict.Fail, "verify.error", "retest rack"), (runs[0].Slot, runs[0].Verdict, runs[0].FirstFailingReading, runs[0].Disposition));
        Assert.Equal(failed.Reason, runs[0].Reason);
        Assert.Equal(failed.EndedUtc, runs[0].EndedUtc);
        Assert.Equal((1, Verdict.Pass, "packing tray"), (runs[1].Slot, runs[1].Verdict, runs[1].Disposition));
        Assert.True(runs[0].Seq < runs[1].Seq);
    }

    [Fact]
    public async Task ForScanAsync_PassedSinceTheDayStarted_SaysPassedToday()
    {
        var directory = Some.TempDirectory();
        var run = new RunRecordBuilder().WithSerial("CTP40A-2612-000001").Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        var reader = new SerialHistoryReader(directory);
        var sameDay = await reader.ForScanAsync("CTP40A-2612-000001", new DateTimeOffset(run.EndedUtc.UtcDateTime.Date, TimeSpan.Zero), CancellationToken.None);
        var nextDay = await reader.ForScanAsync("CTP40A-2612-000001", new DateTimeOffset(run.EndedUtc.UtcDateTime.Date.AddDays(1), TimeSpan.Zero), CancellationToken.None);

        Assert.Equal((1, true), (sameDay.PreviousRuns, sameDay.PassedToday));
        Assert.Equal((1, false), (nextDay.PreviousRuns, nextDay.PassedToday));
    }
}
