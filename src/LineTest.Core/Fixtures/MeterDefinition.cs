namespace LineTest.Core.Fixtures;

/// <summary>The multi-channel DC voltmeter and its specification (used for Type B uncertainty).</summary>
public sealed record MeterDefinition
{
    /// <summary>Measurement range, volts.</summary>
    public double RangeVolts { get; init; } = 10;

    /// <summary>Accuracy specification: ± (percent of reading).</summary>
    public double AccuracyPercentOfReading { get; init; } = 0.0035;

    /// <summary>Accuracy specification: ± (absolute volts).</summary>
    public double AccuracyOffsetVolts { get; init; } = 0.00005;

    /// <summary>Display resolution, volts.</summary>
    public double ResolutionVolts { get; init; } = 0.000001;

    /// <summary>Integration time in power-line cycles.</summary>
    public double IntegrationPlc { get; init; } = 1;

    /// <summary>Serial connection for a real meter (ignored by the simulator).</summary>
    public PortDefinition? Port { get; init; }
}
