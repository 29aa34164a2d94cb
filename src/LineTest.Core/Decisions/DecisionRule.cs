using System.Text.Json.Serialization;

namespace LineTest.Core.Decisions;

/// <summary>Decision rules of ILAC G8:09/2019 §4.2 that a sequence may name for a reading.</summary>
[JsonConverter(typeof(JsonStringEnumConverter<DecisionRule>))]
public enum DecisionRule
{
    /// <summary>Simple acceptance: acceptance limits equal the tolerance limits (guard band w = 0).</summary>
    [JsonStringEnumMemberName("simple")] Simple,

    /// <summary>Guarded acceptance: acceptance limits moved inside the tolerance by w = r·U.</summary>
    [JsonStringEnumMemberName("guarded")] Guarded,
}
