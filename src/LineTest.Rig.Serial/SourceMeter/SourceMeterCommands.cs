using System.Globalization;

namespace LineTest.Rig.Serial.SourceMeter;

/// <summary>
/// The SCPI commands the source-measure unit driver uses (SCPI-1999 subsystems SOURce, SENSe, ROUTe, OUTPut and the
/// IEEE 488.2 common commands). Settings have no reply; errors go to the error queue (<c>SYST:ERR?</c>).
/// <c>READ?</c> answers <c>&lt;volts NR3&gt;,&lt;compliance 0|1&gt;</c>: the measured voltage and 1 when the source is in
/// compliance (it could not force the set current without exceeding the voltage limit; the voltage is then the limit).
/// </summary>
public static class SourceMeterCommands
{
    /// <summary>Source current (not voltage).</summary>
    public const string SourceCurrentFunction = "SOUR:FUNC CURR";

    /// <summary>Output on.</summary>
    public const string OutputOn = "OUTP ON";

    /// <summary>Output off.</summary>
    public const string OutputOff = "OUTP OFF";

    /// <summary>Trigger one measurement and return it.</summary>
    public const string Read = "READ?";

    /// <summary>Sets the source current, amperes.</summary>
    public static string SourceCurrent(double amps) => string.Create(CultureInfo.InvariantCulture, $"SOUR:CURR {amps:R}");

    /// <summary>Sets the voltage compliance (protection) limit, volts.</summary>
    public static string VoltageCompliance(double volts) => string.Create(CultureInfo.InvariantCulture, $"SENS:VOLT:PROT {volts:R}");

    /// <summary>Closes one scanner channel (opening the others).</summary>
    public static string CloseChannel(int channel) => string.Create(CultureInfo.InvariantCulture, $"ROUT:CLOS (@{channel})");

    /// <summary>A <c>READ?</c> reply: NR3 volts, a comma, the compliance flag.</summary>
    public static string Reading(double volts, bool inCompliance) =>
        string.Create(CultureInfo.InvariantCulture, $"{volts:E16},{(inCompliance ? 1 : 0)}");
}
