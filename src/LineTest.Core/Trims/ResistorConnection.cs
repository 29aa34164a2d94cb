using System.Text.Json.Serialization;

namespace LineTest.Core.Trims;

/// <summary>How the part or parts of a select-on-test position are fitted.</summary>
[JsonConverter(typeof(JsonStringEnumConverter<ResistorConnection>))]
public enum ResistorConnection
{
    /// <summary>One resistor.</summary>
    [JsonStringEnumMemberName("single")] Single,

    /// <summary>Two resistors in series: R = R1 + R2.</summary>
    [JsonStringEnumMemberName("series")] Series,

    /// <summary>Two resistors in parallel: R = R1·R2/(R1 + R2).</summary>
    [JsonStringEnumMemberName("parallel")] Parallel,
}
