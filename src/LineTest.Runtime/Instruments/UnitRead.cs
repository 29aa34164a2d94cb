namespace LineTest.Runtime.Instruments;

/// <summary>What a step reads from a unit during a measurement.</summary>
internal enum UnitRead
{
    /// <summary>Volts on the slot's output channel.</summary>
    MeterVolts,

    /// <summary>The raw sensor reading over the unit's link, counts.</summary>
    Raw,

    /// <summary>The temperature the unit reports over its link, °C.</summary>
    Temperature,
}
