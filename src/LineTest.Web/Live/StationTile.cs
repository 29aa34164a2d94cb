using LineTest.Core.Results;
using LineTest.Factory.Forwarding;
using LineTest.Factory.Reporting;

namespace LineTest.Web.Live;

/// <summary>What one tile of the line page shows for one station.</summary>
public sealed record StationTile
{
    /// <summary>Station id (or folder name before its first run).</summary>
    public required string Name { get; init; }

    /// <summary>Where the station's runs are read from.</summary>
    public required string Where { get; init; }

    /// <summary>The station's state in words, e.g. "testing 4 units" or "idle since 06:12".</summary>
    public required string State { get; init; }

    /// <summary>testing, idle, stopped, waiting (no run yet) or unreadable: for the tile's colour.</summary>
    public required string StateKind { get; init; }

    /// <summary>Runs that ended this shift.</summary>
    public required int ShiftRuns { get; init; }

    /// <summary>Runs that ended today (UTC).</summary>
    public required int TodayRuns { get; init; }

    /// <summary>Units per hour this shift (every run counts: a retest goes through the station again).</summary>
    public double? UnitsPerHour { get; init; }

    /// <summary>First-pass yield this shift (0…1).</summary>
    public double? ShiftFirstPassYield { get; init; }

    /// <summary>First-pass yield today (0…1).</summary>
    public double? TodayFirstPassYield { get; init; }

    /// <summary>Serial of the last run stored today; null when none.</summary>
    public string? LastSerial { get; init; }

    /// <summary>Verdict of the last run.</summary>
    public Verdict? LastVerdict { get; init; }

    /// <summary>When the last run ended.</summary>
    public DateTimeOffset? LastEndedUtc { get; init; }

    /// <summary>Why the last run failed or erred.</summary>
    public string? LastReason { get; init; }

    /// <summary>What the factory database holds of the station (forwarding), when the page reads the factory database.</summary>
    public FactoryStationHead? Factory { get; init; }

    /// <summary>The station's own forwarding backlog (the page inside a forwarding station), or null.</summary>
    public FactoryBacklogStatus? Backlog { get; init; }
}
