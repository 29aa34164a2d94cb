using LineTest.TestSupport;
using Npgsql;

namespace LineTest.Station.Tests.Cli;

/// <summary>The factory commands as a user meets them when the database is not what this LineTest expects.</summary>
public sealed class FactoryPackCommandTests
{
    [PostgresFact]
    public async Task BenchFactory_DatabaseOfANewerSchema_OneLineNoStackTrace()
    {
        // Found by running an older build against a database a newer one had migrated: an unhandled exception.
        var name = "lt_cli_" + Guid.NewGuid().ToString("N")[..12];
        var factory = await TestPostgres.CreateDatabaseAsync(name);
        try
        {
            await using (var connection = new NpgsqlConnection(factory))
            {
                await connection.OpenAsync();
                await new NpgsqlCommand(
                    "CREATE TABLE schema_migrations (version integer PRIMARY KEY, name text NOT NULL, sha256 text NOT NULL, applied_utc timestamptz NOT NULL DEFAULT now()); INSERT INTO schema_migrations (version, name, sha256) VALUES (99, '0099_future.sql', 'x');",
                    connection).ExecuteNonQueryAsync();
            }

            var (exit, output, error) = await CliRunner.RunAsync("bench-factory", "--mode", "report", "--existing", "--factory", factory);

            Assert.Equal(1, exit);
            Assert.Contains("schema version 99", error, StringComparison.Ordinal);
            Assert.DoesNotContain("   at ", output + error, StringComparison.Ordinal);
        }
        finally
        {
            await TestPostgres.DropDatabaseAsync(name);
        }
    }

    [PostgresFact]
    public async Task ReportFactory_PackDamagedOnTheServer_ExitTwoWithWhatToDelete()
    {
        var name = "lt_cli_" + Guid.NewGuid().ToString("N")[..12];
        var factory = await TestPostgres.CreateDatabaseAsync(name);
        try
        {
            var results = Some.TempDirectory();
            Assert.Equal(0, (await CliRunner.RunAsync("demo", "--stations", "2", "--units", "4", "--results", results, "--factory", factory)).Exit);
            Assert.Equal(0, (await CliRunner.RunAsync("report", "--json", "--factory", factory)).Exit);
            await using (var connection = new NpgsqlConnection(factory))
            {
                await connection.OpenAsync();
                await new NpgsqlCommand("UPDATE run_packs SET body = substring(body from 1 for 100);", connection).ExecuteNonQueryAsync();
            }

            var (exit, output, error) = await CliRunner.RunAsync("report", "--json", "--factory", factory);

            Assert.Equal(2, exit);
            Assert.Contains("cannot be read", error, StringComparison.Ordinal);
            Assert.Contains("DELETE FROM run_packs WHERE chain_id", error, StringComparison.Ordinal);
            Assert.DoesNotContain("   at ", output + error, StringComparison.Ordinal);
        }
        finally
        {
            await TestPostgres.DropDatabaseAsync(name);
        }
    }
}
