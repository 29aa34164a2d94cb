using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>Shows the operator a plain-language prompt and, when <see cref="Confirm"/> is set, waits for Enter.</summary>
public sealed record PromptStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "prompt";

    /// <summary>The text shown to the operator.</summary>
    public required string Text { get; init; }

    /// <summary>Wait for the operator to confirm.</summary>
    public bool Confirm { get; init; }
}
