using LineTest.Storage.Locking;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using LineTest.TestSupport;

namespace LineTest.Storage.Tests.Locking;

public sealed class ResultsFolderLockTests
{
    private static readonly TimeProvider Clock = new Microsoft.Extensions.Time.Testing.FakeTimeProvider(new DateTimeOffset(2026, 12, 3, 6, 30, 0, TimeSpan.Zero));

    [Fact]
    public void TryAcquire_FolderLockedByAnotherHolder_RefusesAtOnceNamingProcessHostAndTime()
    {
        // Regression: two processes on one folder poisoned it for good. Another open file description holding the
        // exclusive lock stands in for the other process here (flock conflicts between descriptions, even in one process);
        // the two-process test is in the station's tests.
        var folder = Some.TempDirectory();
        File.WriteAllText(Path.Combine(folder, ResultsFolderLock.HolderFileName), "pid 4242 host ST-07 since 2026-12-03T05:00:00Z\n");
        using var other = new FileStream(Path.Combine(folder, ResultsFolderLock.LockFileName), FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);

        var attempt = ResultsFolderLock.TryAcquire(folder, Clock);

        Assert.False(attempt.IsTaken);
        Assert.Equal($"results folder {Path.GetFullPath(folder)} is in use by process 4242 on ST-07 since 2026-12-03 05:00:00 UTC", attempt.Refusal);
        Assert.Equal(new LockHolder(4242, "ST-07", new DateTimeOffset(2026, 12, 3, 5, 0, 0, TimeSpan.Zero)), attempt.Holder);
    }

    [Fact]
    public void TryAcquire_Free_WritesThisProcessAsHolderAndLocksOutOthersUntilDisposed()
    {
        var folder = Path.Combine(Some.TempDirectory(), "new");

        using (var taken = ResultsFolderLock.TryAcquire(folder, Clock).Lock)
        {
            Assert.NotNull(taken);
            var holder = LockHolder.Parse(File.ReadAllText(Path.Combine(folder, ResultsFolderLock.HolderFileName)));
            Assert.Equal(new LockHolder(Environment.ProcessId, Environment.MachineName, Clock.GetUtcNow()), holder);
            Assert.Throws<IOException>(() => new FileStream(Path.Combine(folder, ResultsFolderLock.LockFileName), FileMode.Open, FileAccess.ReadWrite, FileShare.None));
        }

        using var after = new FileStream(Path.Combine(folder, ResultsFolderLock.LockFileName), FileMode.Open, FileAccess.ReadWrite, FileShare.None);
        Assert.True(after.CanWrite);
    }

    [Fact]
    public void TryAcquire_TwiceInOneProcess_SharesTheLockUntilTheLastIsReleased()
    {
        var folder = Some.TempDirectory();
        var first = ResultsFolderLock.TryAcquire(folder, Clock).Lock!;
        var second = ResultsFolderLock.TryAcquire(folder, Clock).Lock!;

        first.Dispose();
        Assert.True(ResultsFolderLock.IsHeldHere(folder));
        second.Dispose();

        Assert.False(ResultsFolderLock.IsHeldHere(folder));
    }

    [Fact]
    public void Open_FolderLockedByAnotherHolder_ThrowsInUseWithTheRefusal()
    {
        var folder = Some.TempDirectory();
        File.WriteAllText(Path.Combine(folder, ResultsFolderLock.HolderFileName), "pid 77 host ST-02 since 2026-12-03T04:00:00Z\n");
        using var other = new FileStream(Path.Combine(folder, ResultsFolderLock.LockFileName), FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);

        var ex = Assert.Throws<ResultStoreException>(() => SqliteResultStore.Open(folder));

        Assert.Equal(ResultStoreFailure.InUse, ex.Failure);
        Assert.Contains("is in use by process 77 on ST-02", ex.Message, StringComparison.Ordinal);
        Assert.False(File.Exists(ResultsDatabase.PathIn(folder)));
    }

    [Theory]
    [InlineData("pid 12 host A since 2026-12-03T05:00:00Z", true)]
    [InlineData("pid x host A since 2026-12-03T05:00:00Z", false)]
    [InlineData("", false)]
    [InlineData("pid 12 host A", false)]
    public void Parse_Line_ReadsOnlyWhatToLineWrites(string line, bool reads)
    {
        Assert.Equal(reads, LockHolder.Parse(line) is not null);
    }
}
