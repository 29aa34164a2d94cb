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
        Assert.Contains($"differs from the released ctp40a-dac r3: released {Sha256Of(released)}, file {Sha256Of(changed)}", error, StringComparison.Ordinal);
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

    [Fact]
    public async Task Release_SameFileTwice_SecondIsANoOpWithAMessage()
    {
        var results = Some.TempDirectory();
        var sequence = RepoFiles.Path("sequences/ctp40a-dac.json");

        await CliRunner.RunAsync("release", sequence, "--by", "engineer one", "--results", results);
        var (exit, output, error) = await CliRunner.RunAsync("release", sequence, "--by", "engineer two", "--results", results);

        Assert.True(exit == 0, error);
        Assert.Contains($"revision 3 of ctp40a-dac ({Sha256Of(sequence)}) is already released, by engineer one", output, StringComparison.Ordinal);
        Assert.Contains("nothing changed", output, StringComparison.Ordinal);
        Assert.Equal(1L, Scalar(results, "SELECT count(*) FROM releases"));
    }

    [Fact]
    public async Task Release_ChangedFileUnderAReleasedRevision_RefusedRaiseTheRevision()
    {
        var results = Some.TempDirectory();
        var released = RepoFiles.Path("sequences/ctp40a-dac.json");
        var changed = Path.Combine(Some.TempDirectory(), "ctp40a-dac.json");
        File.WriteAllText(changed, File.ReadAllText(released).Replace("\"samples\": 10", "\"samples\": 12", StringComparison.Ordinal));
        await CliRunner.RunAsync("release", released, "--by", "engineer", "--results", results);

        var (exit, _, error) = await CliRunner.RunAsync("release", changed, "--by", "engineer", "--results", results);

        Assert.Equal(1, exit);
        Assert.Contains($"revision 3 of ctp40a-dac is already released as {Sha256Of(released)}", error, StringComparison.Ordinal);
        Assert.Contains("raise the revision", error, StringComparison.Ordinal);
        Assert.Equal(1L, Scalar(results, "SELECT count(*) FROM releases"));
    }

    [Fact]
    public async Task Release_RevokedThenProductionDemo_RefusedAndListShowsTheRevocation()
    {
        var results = Some.TempDirectory();
        var sequence = RepoFiles.Path("sequences/ctp40a-dac.json");
        var sha = Sha256Of(sequence);
        await CliRunner.RunAsync("release", sequence, "--by", "engineer", "--results", results);

        var (revokeExit, revokeOut, revokeErr) = await CliRunner.RunAsync(
            "release", "--revoke", sha[..12], "--by", "quality lead", "--reason", "cold limit too wide", "--results", results);
        var (demoExit, _, demoErr) = await CliRunner.RunAsync("demo", "--units", "1", "--results", results, "--production");
        var (listExit, listOut, _) = await CliRunner.RunAsync("release", "--list", "--results", results);

        Assert.True(revokeExit == 0, revokeErr);
        Assert.Contains($"Revoked ctp40a-dac r3 (sha256 {sha}) by quality lead", revokeOut, StringComparison.Ordinal);
        Assert.Equal(2, demoExit);
        Assert.Contains("was revoked by quality lead", demoErr, StringComparison.Ordinal);
        Assert.Equal(0, listExit);
        Assert.Contains($"ctp40a-dac r3  {sha}  released by engineer", listOut, StringComparison.Ordinal);
        Assert.Contains("REVOKED by quality lead", listOut, StringComparison.Ordinal);
        Assert.Equal(0L, Scalar(results, "SELECT count(*) FROM runs"));
        Assert.Equal(0, (await CliRunner.RunAsync("verify", "--results", results)).Exit);
    }

    [Theory]
    [InlineData("--list", "--revoke", "abcdef12")]
    [InlineData("--revoke", "abcdef12", "--by", "x")]
    public async Task Release_BadCombination_ExitsTwo(params string[] args)
    {
        var (exit, _, _) = await CliRunner.RunAsync(["release", .. args, "--results", Some.TempDirectory()]);

        Assert.Equal(2, exit);
    }

    private static long Scalar(string results, string sql)
    {
        using var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Mode=ReadOnly;Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return (long)command.ExecuteScalar()!;
    }
}
