using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>Asks the unit over its link who it is; the unit must report the scanned serial and the sequence's product.</summary>
public sealed record IdentifyStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "identify";
}
