using System.Security.Cryptography;
using LineTest.TestSupport;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Tests.Cli;

public sealed class ReleaseCommandTests
{
    private static string Sha256Of(string path) => Convert.ToHexStringLower(SHA256.HashData(File.ReadAllBytes(path)));

    [Fact]
    public async Task Release_ThenProductionDemo_RunsAndMarksRunsProduction()
    {
        var results = Some.TempDirectory();
        var sequence = RepoFiles.Path("sequences/ctp40a-dac.json");

        var (releaseExit, releaseOut, releaseErr) = await CliRunner.RunAsync("release", sequence, "--by", "test engineer", "--results", results);
        var (demoExit, _, demoErr) = await CliRunner.RunAsync("demo", "--units", "2", "--results", results, "--production", "--json");

        Assert.True(releaseExit == 0, releaseErr);
        Assert.Contains(Sha256Of(sequence), releaseOut, StringComparison.Ordinal);
        Assert.True(demoExit == 0, demoErr);
        using var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Mode=ReadOnly;Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT group_concat(DISTINCT mode), (SELECT released_by FROM releases) FROM runs";
        using var reader = command.ExecuteReader();
        Assert.True(reader.Read());
        Assert.Equal("production", reader.GetString(0));
        Assert.Equal("test engineer", reader.GetString(1));
    }

    [Fact]
    public async Task ProductionDemo_ChangedFileOfAReleasedRevision_RefusedNamingBothHashesBeforeAnyUnit()
    {
        var results = Some.TempDirectory();
        var released = RepoFiles.Path("sequences/ctp40a-dac.json");
        var changed = Path.Combine(Some.TempDirectory(), "ctp40a-dac.json");
        File.WriteAllText(changed, File.ReadAllText(released).Replace("\"samples\": 10", "\"samples\": 12", StringComparison.Ordinal));
        await CliRunner.RunAsync("release", released, "--by", "test engineer", "--results", results);

        var (exit, _, error) = await CliRunner.RunAsync("demo", "--units", "2", "--results", results, "--production", "--sequence", changed);

        Assert.Equal(2, exit);
        Assert.Contains($"differs from the released ctp40a-dac r2: released {Sha256Of(released)}, file {Sha256Of(changed)}", error, StringComparison.Ordinal);
        using var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Mode=ReadOnly;Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT count(*) FROM runs";
        Assert.Equal(0L, (long)command.ExecuteScalar()!);
    }

    [Fact]
    public async Task EngineeringDemo_UnreleasedFile_RunsAndMarksRunsEngineering()
    {
        var results = Some.TempDirectory();

        var (exit, _, error) = await CliRunner.RunAsync("demo", "--units", "1", "--results", results, "--json");

        Assert.True(exit == 0, error);
        using var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Mode=ReadOnly;Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT mode FROM runs";
        Assert.Equal("engineering", (string)command.ExecuteScalar()!);
    }

    [Fact]
    public async Task Release_FileWithProblems_ExitTwoAndNothingReleased()
    {
        var broken = Path.Combine(Some.TempDirectory(), "broken.json");
        File.WriteAllText(broken, "{ \"id\": \"x\" }");
        var results = Some.TempDirectory();

        var (exit, _, error) = await CliRunner.RunAsync("release", broken, "--by", "someone", "--results", results);

        Assert.Equal(2, exit);
        Assert.Contains("was not released", error, StringComparison.Ordinal);
        Assert.False(File.Exists(Path.Combine(results, "results.db")));
    }
}
