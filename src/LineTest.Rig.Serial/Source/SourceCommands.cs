namespace LineTest.Rig.Serial.Source;

/// <summary>
/// The temperature-source protocol (our own small SCPI-style set; see docs/instrument-protocols.md). Every command
/// is answered: queries with their value, settings with <c>OK</c>, anything refused with <c>ERR code,text</c>.
/// </summary>
public static class SourceCommands
{
    /// <summary>IEEE 488.2 identity query: <c>maker,model,serial,firmware</c>.</summary>
    public const string Identify = "*IDN?";

    /// <summary>The control sensor's temperature, °C.</summary>
    public const string ReadTemperature = "SOUR:TEMP?";

    /// <summary>Status: <c>setpoint,actual,OK</c> or <c>setpoint,actual,FAULT text</c>.</summary>
    public const string ReadStatus = "SOUR:STAT?";

    /// <summary>Go to the standby temperature the source holds in its own settings.</summary>
    public const string Standby = "SOUR:STBY";

    /// <summary>The header of the setpoint command; the argument is °C.</summary>
    public const string SetSetpointHeader = "SOUR:SETP";

    /// <summary>The status field of a source without a fault.</summary>
    public const string NoFault = "OK";

    /// <summary>The prefix of a status fault field.</summary>
    public const string FaultPrefix = "FAULT ";

    /// <summary>The setpoint command for <paramref name="celsius"/>.</summary>
    public static string SetSetpoint(double celsius) => $"{SetSetpointHeader} {Transport.Replies.Number(celsius)}";
}
