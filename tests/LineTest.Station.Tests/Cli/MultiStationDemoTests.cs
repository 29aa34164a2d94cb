using System.Text.Json.Nodes;
using LineTest.TestSupport;
using Npgsql;

namespace LineTest.Station.Tests.Cli;

public sealed class MultiStationDemoTests
{
    [PostgresFact]
    public async Task DemoThreeStationsWithFactory_ReportVerifyAndForwardAgreeWithTheFolders()
    {
        var name = "lt_cli_" + Guid.NewGuid().ToString("N")[..12];
        var factory = await TestPostgres.CreateDatabaseAsync(name);
        try
        {
            var results = Some.TempDirectory();
            var (exit, output, error) = await CliRunner.RunAsync("demo", "--stations", "3", "--units", "4", "--results", results, "--factory", factory);
            Assert.True(exit == 0, error);
            Assert.Equal(3, output.Split('\n').Count(l => l.Contains("factory: up to date", StringComparison.Ordinal)));

            // Each station its own folder, id and serial block.
            var folders = new[] { "ST-01", "ST-02", "ST-03" }.Select(s => Path.Combine(results, s)).ToArray();
            Assert.All(folders, f => Assert.True(File.Exists(Path.Combine(f, "results.db")), f));
            Assert.Contains("-100001", output, StringComparison.Ordinal);
            Assert.Contains("-200001", output, StringComparison.Ordinal);

            var fromFolders = await CliRunner.RunAsync(["report", "--json", "--by", "station", .. folders.SelectMany(f => new[] { "--results", f })]);
            var fromFactory = await CliRunner.RunAsync("report", "--json", "--by", "station", "--factory", factory);
            Assert.Equal(0, fromFactory.Exit);
            Assert.Equal(WithoutSources(fromFolders.Out), WithoutSources(fromFactory.Out));

            var verified = await CliRunner.RunAsync("verify", "--factory", factory, "--station", "ST-02", "--results", folders[1]);
            Assert.True(verified.Exit == 0, verified.Out + verified.Err);
            Assert.Contains("agrees", verified.Out, StringComparison.Ordinal);

            var again = await CliRunner.RunAsync("forward", "--results", folders[0], "--factory", factory);
            Assert.Equal(0, again.Exit);
            Assert.Contains("0 stored", again.Out, StringComparison.Ordinal);

            await using (var edit = new NpgsqlConnection(factory))
            {
                await edit.OpenAsync();
                await new NpgsqlCommand("UPDATE runs SET serial = serial || 'X' WHERE station = 'ST-03' AND station_seq = 2;", edit).ExecuteNonQueryAsync();
            }

            var caught = await CliRunner.RunAsync("verify", "--factory", factory);
            Assert.Equal(1, caught.Exit);
            Assert.Contains("column-edited at seq 2", caught.Out, StringComparison.Ordinal);
        }
        finally
        {
            await TestPostgres.DropDatabaseAsync(name);
        }
    }

    private static string WithoutSources(string json)
    {
        var node = JsonNode.Parse(json)!.AsObject();
        node.Remove("sources");
        node.Remove("generatedUtc");
        return node.ToJsonString();
    }
}
