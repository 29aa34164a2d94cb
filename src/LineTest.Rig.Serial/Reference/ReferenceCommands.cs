namespace LineTest.Rig.Serial.Reference;

/// <summary>
/// The reference-readout protocol (our own; see docs/instrument-protocols.md): <c>*IDN?</c>, and <c>MEAS?</c>
/// answered <c>value,unit</c> with unit <c>OHM</c> (PRT or thermistor), <c>MV</c> (thermocouple) or <c>CEL</c>
/// (a readout that converts itself); errors as <c>ERR code,text</c>.
/// </summary>
public static class ReferenceCommands
{
    /// <summary>IEEE 488.2 identity query.</summary>
    public const string Identify = "*IDN?";

    /// <summary>One reading of the reference channel in its raw unit.</summary>
    public const string Measure = "MEAS?";

    /// <summary>Ohms.</summary>
    public const string Ohms = "OHM";

    /// <summary>Millivolts.</summary>
    public const string Millivolts = "MV";

    /// <summary>Degrees Celsius.</summary>
    public const string Celsius = "CEL";

    /// <summary>True when <see cref="UnitFor"/> knows <paramref name="sensorKind"/>.</summary>
    public static bool UnitForKnown(string sensorKind) => sensorKind is "prt" or "thermistor" or "thermocouple" or "celsius";

    /// <summary>The unit a readout reports for a reference sensor kind of the fixture (<c>prt</c>, <c>thermistor</c>, <c>thermocouple</c>, <c>celsius</c>).</summary>
    public static string UnitFor(string sensorKind) => sensorKind switch
    {
        "prt" or "thermistor" => Ohms,
        "thermocouple" => Millivolts,
        "celsius" => Celsius,
        _ => throw new ArgumentOutOfRangeException(nameof(sensorKind), sensorKind, "Unknown reference sensor kind (known: prt, thermistor, thermocouple, celsius)."),
    };
}
