namespace LineTest.Core.Sequences;

/// <summary>A named reference temperature the sequence asks for.</summary>
public sealed record SetpointDefinition
{
    /// <summary>Name steps refer to, e.g. <c>cal-low</c>.</summary>
    public required string Name { get; init; }

    /// <summary>Temperature, °C. Must lie inside the fixture's safe range.</summary>
    public required double Celsius { get; init; }

    /// <summary>This setpoint's own settle settings, replacing the sequence's <c>settle</c>; null keeps the sequence's.</summary>
    public SettleSettings? Settle { get; init; }
}
