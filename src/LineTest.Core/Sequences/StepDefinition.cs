using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>
/// One entry of a sequence. The JSON key <c>kind</c> selects the step kind.
/// To add a step kind: derive a record here, add a <see cref="JsonDerivedTypeAttribute"/> line, describe it in
/// <see cref="Steps.StepKinds"/> (checks, setpoint, planner role, time, screen words) and execute it in the runtime's
/// <c>Steps/StepExecutors</c> (see DEVELOPERS.md).
/// </summary>
[JsonPolymorphic(TypeDiscriminatorPropertyName = "kind", UnknownDerivedTypeHandling = JsonUnknownDerivedTypeHandling.FailSerialization)]
[JsonDerivedType(typeof(IdentifyStep), "identify")]
[JsonDerivedType(typeof(SupplyCurrentStep), "supply-current")]
[JsonDerivedType(typeof(SettleStep), "settle")]
[JsonDerivedType(typeof(MeasureStep), "measure")]
[JsonDerivedType(typeof(TrimStep), "trim")]
[JsonDerivedType(typeof(VerifyStep), "verify")]
[JsonDerivedType(typeof(PromptStep), "prompt")]
[JsonDerivedType(typeof(IvSweepStep), "iv-sweep")]
public abstract record StepDefinition
{
    /// <summary>Step name, used as the reading name or its prefix. Defaults per kind.</summary>
    public string? Name { get; init; }

    /// <summary>The kind word as written in the JSON file.</summary>
    [JsonIgnore]
    public abstract string Kind { get; }

    /// <summary>The name readings of this step are stored under.</summary>
    [JsonIgnore]
    public string DisplayName => Name ?? Kind;
}
