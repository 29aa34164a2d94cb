namespace LineTest.Rig.Instruments;

/// <summary>
/// The reference thermometer readout. It reports the raw quantity of its sensor
/// (ohms for a PRT or thermistor, millivolts for a thermocouple, or °C for a readout that converts itself);
/// conversion to temperature is done by the reference-thermometry code in the core.
/// </summary>
public interface IReferenceReadout
{
    /// <summary>Reads the reference channel in its raw unit.</summary>
    Task<double> ReadRawAsync(CancellationToken cancellationToken);
}
