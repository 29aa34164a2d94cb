using System.Globalization;

namespace LineTest.Rig.Serial.Meter;

/// <summary>
/// The SCPI commands the voltmeter driver uses (SCPI-1999 and IEEE 488.2 common commands). Settings have no reply;
/// errors go to the instrument's error queue, read with <c>SYST:ERR?</c> (<c>+0,"No error"</c> when empty).
/// </summary>
public static class ScpiCommands
{
    /// <summary>IEEE 488.2 identity query.</summary>
    public const string Identify = "*IDN?";

    /// <summary>IEEE 488.2 reset to the power-on settings (opens every scanner channel).</summary>
    public const string Reset = "*RST";

    /// <summary>IEEE 488.2 clear status (empties the error queue).</summary>
    public const string ClearStatus = "*CLS";

    /// <summary>Oldest entry of the error queue.</summary>
    public const string ReadError = "SYST:ERR?";

    /// <summary>The reply of an empty error queue.</summary>
    public const string NoError = "+0,\"No error\"";

    /// <summary>Above this magnitude a reading is the SCPI overload value 9.9E37, not a voltage.</summary>
    public const double OverloadVolts = 9.9e37;

    /// <summary>DC volts on a fixed range.</summary>
    public static string ConfigureDcVolts(double rangeVolts) => string.Create(CultureInfo.InvariantCulture, $"CONF:VOLT:DC {rangeVolts:R}");

    /// <summary>Integration time in power-line cycles.</summary>
    public static string IntegrationPlc(double plc) => string.Create(CultureInfo.InvariantCulture, $"VOLT:DC:NPLC {plc:R}");

    /// <summary>Closes one scanner channel and triggers a reading in the same message.</summary>
    public static string ReadChannel(int channel) => string.Create(CultureInfo.InvariantCulture, $"ROUT:CLOS (@{channel});:READ?");

    /// <summary>A reading in SCPI NR3 form with 17 significant digits (reads back to the same double).</summary>
    public static string Nr3(double value) => value.ToString("E16", CultureInfo.InvariantCulture);

    /// <summary>An error-queue entry: <c>-113,"Undefined header"</c>.</summary>
    public static string ErrorEntry(int code, string text) => string.Create(CultureInfo.InvariantCulture, $"{code:+0;-0},\"{text.Replace('"', '\'')}\"");
}
