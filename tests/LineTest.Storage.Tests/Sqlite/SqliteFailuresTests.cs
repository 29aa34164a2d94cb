using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteFailuresTests
{
    // Result codes from the SQLite documentation, "Result and Error Codes" [published]; extended codes
    // carry the primary code in their low byte (e.g. SQLITE_IOERR_WRITE = 778 = 10 | 3 << 8).
    public static TheoryData<int, ResultStoreFailure, string> Codes => new()
    {
        { 13, ResultStoreFailure.DiskFull, "is full" },
        { 8, ResultStoreFailure.ReadOnly, "read-only" },
        { 5, ResultStoreFailure.Locked, "locked" },
        { 6, ResultStoreFailure.Locked, "locked" },
        { 14, ResultStoreFailure.CannotOpen, "cannot be opened" },
        { 26, ResultStoreFailure.Incompatible, "not a results database" },
        { 778, ResultStoreFailure.DiskError, "read or write error" },
        { 19, ResultStoreFailure.Rejected, "refused" },
        { 1, ResultStoreFailure.Other, "reported" },
    };

    [Theory]
    [MemberData(nameof(Codes))]
    public void Map_SqliteCode_GivesFailureKindAndPlainMessage(int extendedCode, ResultStoreFailure expected, string words)
    {
        var error = new SqliteException("engine words", extendedCode & 0xFF, extendedCode);

        var mapped = SqliteFailures.Map(error, "Run 7 was not saved", "/data/results.db");

        Assert.Equal(expected, mapped.Failure);
        Assert.StartsWith("Run 7 was not saved: ", mapped.Message, StringComparison.Ordinal);
        Assert.Contains(words, mapped.Message, StringComparison.Ordinal);
        Assert.Same(error, mapped.InnerException);
    }

    [Fact]
    public void Map_NoSpaceLeftIOException_GivesDiskFull()
    {
        // ENOSPC = 28 on Linux [published, Linux errno(3)].
        var error = new IOException("No space left on device", 28);

        Assert.Equal(ResultStoreFailure.DiskFull, SqliteFailures.Map(error, "Run 7 was not saved", "/data/results.db").Failure);
    }
}
