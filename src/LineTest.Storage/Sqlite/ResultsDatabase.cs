using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>Where the results database lives and how connections to it are made.</summary>
public static class ResultsDatabase
{
    /// <summary>The database file's name inside the results folder.</summary>
    public const string FileName = "results.db";

    /// <summary>The full path of the database file in <paramref name="resultsDirectory"/>.</summary>
    public static string PathIn(string resultsDirectory)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsDirectory);
        return Path.GetFullPath(Path.Combine(resultsDirectory, FileName));
    }

    internal static string ConnectionString(string databasePath, SqliteOpenMode mode, TimeSpan? lockTimeout = null) => new SqliteConnectionStringBuilder
    {
        DataSource = databasePath,
        Mode = mode,
        Cache = SqliteCacheMode.Private,
        // No pooling: closing the store must really close the file (so it can be moved, and so a fresh
        // connection after a crash sees exactly what is on disk).
        Pooling = false,
        // Seconds Microsoft.Data.Sqlite keeps retrying a busy database before giving up (it owns the retry loop,
        // so SQLite's own busy_timeout stays 0). Zero would mean "forever", hence at least one second.
        DefaultTimeout = Math.Max(1, (int)Math.Ceiling((lockTimeout ?? TimeSpan.FromSeconds(10)).TotalSeconds)),
    }.ToString();
}
