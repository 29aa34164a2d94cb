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

    internal static string ConnectionString(string databasePath, SqliteOpenMode mode) => new SqliteConnectionStringBuilder
    {
        DataSource = databasePath,
        Mode = mode,
        Cache = SqliteCacheMode.Private,
        // No pooling: closing the store must really close the file (so it can be moved, and so a fresh
        // connection after a crash sees exactly what is on disk).
        Pooling = false,
        // Seconds Microsoft.Data.Sqlite keeps retrying a busy database before giving up.
        DefaultTimeout = 10,
    }.ToString();
}
