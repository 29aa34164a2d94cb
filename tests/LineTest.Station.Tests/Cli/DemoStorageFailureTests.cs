using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Tests.Cli;

// Unix permission bits: the station runs on Linux.
[System.Runtime.Versioning.UnsupportedOSPlatform("windows")]
public sealed class DemoStorageFailureTests
{
    [Fact]
    public async Task Demo_ReadOnlyResultsFolder_StopsBeforeAnyUnitWithAClearMessageAndKeepsStoredRuns()
    {
        var results = Some.TempDirectory();
        await CliRunner.RunAsync("demo", "--units", "2", "--results", results, "--json");
        var path = ResultsDatabase.PathIn(results);
        File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.GroupRead);
        File.SetUnixFileMode(results, UnixFileMode.UserRead | UnixFileMode.UserExecute);
        try
        {
            var (exit, _, error) = await CliRunner.RunAsync("demo", "--units", "2", "--results", results, "--json");

            Assert.Equal(1, exit);
            Assert.Contains("results could not be stored", error, StringComparison.Ordinal);
            Assert.Contains("read-only", error, StringComparison.OrdinalIgnoreCase);
        }
        finally
        {
            File.SetUnixFileMode(results, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute);
            File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite);
        }

        using var connection = new SqliteConnection($"Data Source={path};Mode=ReadOnly;Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT count(*) FROM runs";
        Assert.Equal(2L, (long)command.ExecuteScalar()!);
    }
}
