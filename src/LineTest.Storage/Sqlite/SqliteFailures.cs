using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>Turns database and file-system errors into <see cref="ResultStoreException"/> with a plain message.</summary>
internal static class SqliteFailures
{
    // Primary result codes, https://sqlite.org/rescode.html (the extended code's low byte is the primary code).
    private const int SqlitePerm = 3;
    private const int SqliteBusy = 5;
    private const int SqliteLocked = 6;
    private const int SqliteReadOnly = 8;
    private const int SqliteIoErr = 10;
    private const int SqliteCorrupt = 11;
    private const int SqliteFull = 13;
    private const int SqliteCantOpen = 14;
    private const int SqliteConstraint = 19;
    private const int SqliteAuth = 23;
    private const int SqliteNotADb = 26;

    /// <summary>Maps an exception thrown while <paramref name="what"/> to a plain failure.</summary>
    /// <param name="exception">What the database or file system threw.</param>
    /// <param name="what">What was being done, as the start of a sentence, e.g. "Run 3f… (serial X) was not saved".</param>
    /// <param name="databasePath">The database file.</param>
    public static ResultStoreException Map(Exception exception, string what, string databasePath) => exception switch
    {
        ResultStoreException already => already,
        SqliteException sqlite => FromCode(sqlite.SqliteExtendedErrorCode & 0xFF, sqlite, what, databasePath),
        UnauthorizedAccessException => ReadOnly(what, databasePath, exception),
        IOException io when IsDiskFull(io) => new ResultStoreException(
            ResultStoreFailure.DiskFull, $"{what}: the disk holding '{databasePath}' is full. Free space on that disk, then resume testing.", io),
        IOException io => new ResultStoreException(
            ResultStoreFailure.DiskError, $"{what}: the disk reported an error on '{databasePath}' ({io.Message}). Check the disk, then resume testing.", io),
        _ => new ResultStoreException(ResultStoreFailure.Other, $"{what}: {exception.Message}", exception),
    };

    /// <summary>The read-only failure, also used when the file's permissions say so before SQLite is asked.</summary>
    public static ResultStoreException ReadOnly(string what, string path, Exception? inner = null) => new(
        ResultStoreFailure.ReadOnly,
        $"{what}: the results database '{path}' is read-only. Make the file and its folder writable, then resume testing.",
        inner);

    private static ResultStoreException FromCode(int code, SqliteException inner, string what, string path) => code switch
    {
        SqliteFull => new ResultStoreException(
            ResultStoreFailure.DiskFull, $"{what}: the disk holding '{path}' is full. Free space on that disk, then resume testing.", inner),
        SqliteReadOnly or SqlitePerm or SqliteAuth => ReadOnly(what, path, inner),
        SqliteBusy or SqliteLocked => new ResultStoreException(
            ResultStoreFailure.Locked,
            $"{what}: another program is keeping the results database '{path}' locked. Close any program that has it open for writing, then resume testing.",
            inner),
        SqliteCantOpen => new ResultStoreException(
            ResultStoreFailure.CannotOpen,
            $"{what}: the results database '{path}' cannot be opened. Check that its folder exists and is writable.",
            inner),
        SqliteCorrupt or SqliteNotADb => new ResultStoreException(
            ResultStoreFailure.Incompatible,
            $"{what}: '{path}' is damaged or is not a results database. Move it aside and keep it for inspection; LineTest will start a new one.",
            inner),
        SqliteIoErr => new ResultStoreException(
            ResultStoreFailure.DiskError, $"{what}: the disk reported a read or write error on '{path}'. Check the disk, then resume testing.", inner),
        SqliteConstraint => new ResultStoreException(
            ResultStoreFailure.Rejected, $"{what}: the results database refused it ({inner.Message}).", inner),
        _ => new ResultStoreException(ResultStoreFailure.Other, $"{what}: the results database '{path}' reported: {inner.Message}", inner),
    };

    private static bool IsDiskFull(IOException io)
    {
        // ENOSPC is 28 on Linux; ERROR_DISK_FULL 112 and ERROR_HANDLE_DISK_FULL 39 on Windows (HResult low word).
        var code = io.HResult & 0xFFFF;
        return code is 28 or 112 or 39;
    }
}
