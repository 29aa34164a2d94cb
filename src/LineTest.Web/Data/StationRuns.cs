using LineTest.Factory.Forwarding;
using LineTest.Factory.Reporting;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;

namespace LineTest.Web.Data;

/// <summary>One station's recent runs for a tile of the line page.</summary>
/// <param name="Name">Station id (from its runs) or, before the first run, the folder's name.</param>
/// <param name="Where">Where the runs are read from (a results folder, or the factory database).</param>
/// <param name="Runs">The recent runs; empty when there are none or they could not be read.</param>
/// <param name="Live">Last seq and runs in progress; null when the station has stored nothing yet or could not be read.</param>
/// <param name="Problem">Why the station could not be read, or null.</param>
public sealed record StationRuns(string Name, string Where, RunTable Runs, LiveState? Live, string? Problem)
{
    /// <summary>What the factory database holds of the station, when the runs are read from there; null for a results folder.</summary>
    public FactoryStationHead? Factory { get; init; }

    /// <summary>The station's own forwarding backlog, when the page runs inside the station (<c>Station:Web:Listen</c>) and it forwards.</summary>
    public FactoryBacklogStatus? Backlog { get; init; }
}
