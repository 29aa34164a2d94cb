using LineTest.Factory.Tests.Support;
using LineTest.Factory.Verification;

namespace LineTest.Factory.Tests.Verification;

public sealed class FactoryVerifierTests
{
    private static readonly DateTimeOffset Start = new(2026, 2, 3, 6, 0, 0, TimeSpan.Zero);

    [PostgresFact]
    public async Task VerifyAsync_UntouchedFactory_EveryChainIntactWithTheStationsHeads()
    {
        await using var database = await Forwarded(out var stations);
        var checks = await FactoryVerifier.VerifyAsync(database.DataSource);

        Assert.Equal(["ST-01", "ST-02"], checks.Select(c => c.Station));
        Assert.All(checks, c => Assert.True(c.IsIntact, c.FirstProblem?.Message));
        Assert.All(checks, c => Assert.Equal(8, c.RunsChecked));
        await DisposeAll(stations);
    }

    public static TheoryData<string, string, string> Edits => new()
    {
        { "run text edited", "UPDATE runs SET run_json = replace(run_json, 'LOT-A', 'LOT-Z') WHERE station_seq = 4", "edited" },
        { "verdict column edited", "UPDATE runs SET verdict = 'pass' WHERE station_seq = 7", "column-edited" },
        { "reading value edited", "UPDATE readings SET value = value + 0.001 WHERE station_seq = 5 AND ordinal = 1", "readings-edited" },
        { "reading deleted", "DELETE FROM readings WHERE station_seq = 2 AND ordinal = 0", "readings-edited" },
        { "run deleted mid-chain", "DELETE FROM runs WHERE station_seq = 3", "chain-break" },
        { "last run deleted", "DELETE FROM runs WHERE station_seq = 8", "missing-at-end" },
    };

    [PostgresTheory]
    [MemberData(nameof(Edits))]
    public async Task VerifyAsync_EditOrDeletionOnTheServer_Caught(string what, string sql, string kind)
    {
        await using var database = await Forwarded(out var stations);
        await database.ExecuteAsync(sql.Replace("WHERE", "WHERE station = 'ST-02' AND", StringComparison.Ordinal));

        var checks = await FactoryVerifier.VerifyAsync(database.DataSource);

        Assert.True(checks.Single(c => c.Station == "ST-01").IsIntact, what);
        Assert.Equal(kind, checks.Single(c => c.Station == "ST-02").FirstProblem?.Kind);
        await DisposeAll(stations);
    }

    [PostgresFact]
    public async Task CompareWithStation_LastRunsAndTheChainHeadDeletedOnTheServer_Caught()
    {
        await using var database = await Forwarded(out var stations);
        // A careful intruder deletes the last two runs and moves the chain's head back, so the chain alone looks whole.
        await database.ExecuteAsync("""
            DELETE FROM runs WHERE station = 'ST-02' AND station_seq > 6;
            UPDATE chains c SET head_seq = 6, runs = 6, head_sha256 = (SELECT record_sha256 FROM runs r WHERE r.chain_id = c.chain_id AND r.station_seq = 6)
             WHERE station = 'ST-02';
            """);
        var check = (await FactoryVerifier.VerifyAsync(database.DataSource, "ST-02")).Single();
        Assert.True(check.IsIntact);

        var problem = FactoryVerifier.CompareWithStation(check, seq => seq <= 8 ? "x" : null, forwardedThroughSeq: 8);

        Assert.Equal("behind-station", problem?.Kind);
        await DisposeAll(stations);
    }

    private static Task<TestDatabase> Forwarded(out List<StationFolder> stations)
    {
        var folders = new[] { "ST-01", "ST-02" }.Select(s => new StationFolder(s, Start)).ToList();
        stations = folders;
        return Fill(folders);
    }

    private static async Task<TestDatabase> Fill(List<StationFolder> stations)
    {
        var database = await TestDatabase.CreateAsync();
        var forwarder = Support.Factory.Forwarder(database);
        foreach (var station in stations)
        {
            await station.AddRunsAsync(8);
            await Support.Factory.ForwardAsync(forwarder, station.Directory);
        }

        return database;
    }

    private static async Task DisposeAll(List<StationFolder> stations)
    {
        foreach (var station in stations)
        {
            await station.DisposeAsync();
        }
    }
}
