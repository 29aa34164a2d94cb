using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Station.Campaign;

/// <summary>What a fault campaign runs.</summary>
public sealed record CampaignOptions
{
    /// <summary>The checked simulator fixture.</summary>
    public required FixtureDefinition Fixture { get; init; }

    /// <summary>The checked sequence.</summary>
    public required SequenceDefinition Sequence { get; init; }

    /// <summary>SHA-256 of the sequence file.</summary>
    public required string SequenceSha256 { get; init; }

    /// <summary>Units to test.</summary>
    public required int Units { get; init; }

    /// <summary>Probability, per batch, that one fault is injected (0 … 1).</summary>
    public required double FaultRate { get; init; }

    /// <summary>Seed of the simulator and of the fault draws.</summary>
    public int Seed { get; init; } = 4040;

    /// <summary>Results folder (a fresh one keeps the audit to this campaign).</summary>
    public required string ResultsDirectory { get; init; }

    /// <summary>Station id stored with the runs.</summary>
    public string Station { get; init; } = "ST-01";
}
