namespace LineTest.Runtime.Batches;

/// <summary>How long instrument operations take, so waits are paced like the real instruments (and virtual time is realistic).</summary>
public sealed record InstrumentTiming
{
    /// <summary>One reference readout reading, seconds.</summary>
    public double ReferenceReadSeconds { get; init; } = 1.0;

    /// <summary>One meter reading including the scanner's channel switch, seconds.</summary>
    public double MeterReadSeconds { get; init; } = 0.2;

    /// <summary>One unit-link exchange, seconds.</summary>
    public double UnitExchangeSeconds { get; init; } = 0.05;

    /// <summary>Storing trim values to the unit's non-volatile memory, seconds.</summary>
    public double UnitStoreSeconds { get; init; } = 0.5;
}
