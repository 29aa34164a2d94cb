using System.Text.Json.Serialization;

namespace LineTest.Core.Results;

/// <summary>
/// The outcome of a reading or a run. <see cref="Error"/> means the test could not be completed
/// (instrument fault, unit not answering, cancelled) and is never counted as a pass.
/// </summary>
[JsonConverter(typeof(JsonStringEnumConverter<Verdict>))]
public enum Verdict
{
    /// <summary>Within limits.</summary>
    [JsonStringEnumMemberName("pass")] Pass,

    /// <summary>Outside limits, or a trim out of range.</summary>
    [JsonStringEnumMemberName("fail")] Fail,

    /// <summary>The test could not be completed.</summary>
    [JsonStringEnumMemberName("error")] Error,
}
