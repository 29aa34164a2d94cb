using LineTest.Core.Trims;

namespace LineTest.Core.Sequences;

/// <summary>Which trim method the product uses, and its parameters.</summary>
public sealed record TrimDefinition
{
    /// <summary><c>dac</c>, <c>resistor</c> or <c>firmware</c>.</summary>
    public required string Method { get; init; }

    /// <summary>Parameters of the DAC trim (method <c>dac</c>).</summary>
    public DacTrimSpec? Dac { get; init; }
}
