namespace LineTest.Core.Thermometry;

/// <summary>The raw units a reference readout reports, as used in <see cref="IReferenceSensor.RawUnit"/>.</summary>
public static class RawUnits
{
    /// <summary>Resistance in ohms (platinum resistance thermometers, thermistors).</summary>
    public const string Ohm = "ohm";

    /// <summary>Electromotive force in millivolts (thermocouples).</summary>
    public const string Millivolt = "mV";

    /// <summary>Degrees Celsius (a readout that converts by itself).</summary>
    public const string Celsius = "degC";
}
