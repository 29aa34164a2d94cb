using System.Text.Json.Serialization;

namespace LineTest.Station.Demo;

/// <summary>The closing summary of a simulated shift. JSON keys are a contract (<c>linetest demo --json</c>).</summary>
public sealed record ShiftSummary
{
    /// <summary>Units tested.</summary>
    [JsonPropertyName("units")]
    public required int Units { get; init; }

    /// <summary>Runs that passed.</summary>
    [JsonPropertyName("pass")]
    public required int Pass { get; init; }

    /// <summary>Runs that failed.</summary>
    [JsonPropertyName("fail")]
    public required int Fail { get; init; }

    /// <summary>Runs that could not be completed.</summary>
    [JsonPropertyName("error")]
    public required int Error { get; init; }

    /// <summary>Units that passed on their first run, divided by units (0…1).</summary>
    [JsonPropertyName("firstPassYield")]
    public required double FirstPassYield { get; init; }

    /// <summary>Simulated (virtual) time the shift took, seconds.</summary>
    [JsonPropertyName("simulatedSeconds")]
    public required double SimulatedSeconds { get; init; }

    /// <summary>Wall-clock time the program took, seconds.</summary>
    [JsonPropertyName("wallSeconds")]
    public required double WallSeconds { get; init; }

    /// <summary>The results database the runs were appended to.</summary>
    [JsonPropertyName("resultsPath")]
    public required string ResultsPath { get; init; }

    /// <summary>The results folder's head after the shift (<c>SEQ:HASH</c>, see <c>linetest verify --expect-head</c>), or null.</summary>
    [JsonPropertyName("head")]
    public string? Head { get; init; }
}
