using LineTest.Storage.Sqlite;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Tests;

/// <summary>Direct access to a results database, the way a sqlite3 shell (or a forger) would have it.</summary>
internal static class RawDb
{
    internal static SqliteConnection Open(string directory, SqliteOpenMode mode = SqliteOpenMode.ReadOnly)
    {
        var connection = new SqliteConnection(new SqliteConnectionStringBuilder
        {
            DataSource = ResultsDatabase.PathIn(directory),
            Mode = mode,
            Pooling = false,
        }.ToString());
        connection.Open();
        return connection;
    }

    internal static object? Scalar(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return command.ExecuteScalar();
    }
}
