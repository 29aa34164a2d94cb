namespace LineTest.Rig.Instruments;

/// <summary>The unit's own serial link: identify, raw reading, write trim, store, read back.</summary>
public interface IUnitLink
{
    /// <summary>Asks the unit who it is.</summary>
    Task<UnitIdentity> IdentifyAsync(CancellationToken cancellationToken);

    /// <summary>Reads the unit's raw sensor value (ADC counts for digital units).</summary>
    Task<long> ReadRawAsync(CancellationToken cancellationToken);

    /// <summary>Reads the unit's own temperature output, °C (digital units with coefficients applied).</summary>
    Task<double> ReadTemperatureAsync(CancellationToken cancellationToken);

    /// <summary>Writes trim values (codes or fixed-point coefficients) by name into working registers.</summary>
    Task WriteTrimAsync(IReadOnlyDictionary<string, long> values, CancellationToken cancellationToken);

    /// <summary>Stores the working trim registers to non-volatile memory.</summary>
    Task StoreAsync(CancellationToken cancellationToken);

    /// <summary>Reads the stored trim values back.</summary>
    Task<IReadOnlyDictionary<string, long>> ReadBackAsync(CancellationToken cancellationToken);
}
