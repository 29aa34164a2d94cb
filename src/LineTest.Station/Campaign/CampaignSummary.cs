namespace LineTest.Station.Campaign;

/// <summary>
/// What a fault campaign found. The four figures that must be zero: <see cref="WrongPasses"/>, <see cref="LostRuns"/>,
/// <see cref="RunsWithoutVerdict"/> and <see cref="SourceLeftAwayFromStandby"/>.
/// </summary>
public sealed record CampaignSummary
{
    /// <summary>Units loaded.</summary>
    public required int Units { get; init; }

    /// <summary>Batches run.</summary>
    public required int Batches { get; init; }

    /// <summary>Batches that had a fault injected.</summary>
    public required int FaultedBatches { get; init; }

    /// <summary>Faults injected, by family.</summary>
    public required IReadOnlyDictionary<string, int> FaultsByKind { get; init; }

    /// <summary>Batches stopped as a whole (source, reference or meter fault).</summary>
    public required int AbortedBatches { get; init; }

    /// <summary>Stored runs that passed.</summary>
    public required int Pass { get; init; }

    /// <summary>Stored runs that failed.</summary>
    public required int Fail { get; init; }

    /// <summary>Stored runs in error.</summary>
    public required int Error { get; init; }

    /// <summary>Runs stored as pass whose unit the simulator knows is outside the verify limits at a verify setpoint.</summary>
    public required int WrongPasses { get; init; }

    /// <summary>Units loaded with no stored run.</summary>
    public required int LostRuns { get; init; }

    /// <summary>Units with more than one stored run in the same batch.</summary>
    public required int DuplicateRuns { get; init; }

    /// <summary>Runs left without a verdict (still in the journal of runs in progress at the end).</summary>
    public required int RunsWithoutVerdict { get; init; }

    /// <summary>Stopped batches after which the station's last command to the source was not standby, or a working source was not at standby.</summary>
    public required int SourceLeftAwayFromStandby { get; init; }

    /// <summary>Simulated seconds.</summary>
    public required double SimulatedSeconds { get; init; }

    /// <summary>Wall-clock seconds.</summary>
    public required double WallSeconds { get; init; }

    /// <summary>The results database.</summary>
    public required string ResultsPath { get; init; }
}
