using System.CommandLine;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest convert SENSOR VALUE</c> converts a reference sensor reading (Ω or mV) to °C;
/// <c>linetest convert SENSOR --celsius T</c> converts a temperature to the reading. SENSOR is pt100, pt1000,
/// type-k, type-t or ntc (with <c>--a --b --c</c> or <c>--r25 --beta</c>); <c>--cold-junction C</c> sets a
/// thermocouple's cold junction (default 0 °C); <c>--json</c> prints one object with <c>sensor</c>,
/// <c>celsius</c> and <c>ohms</c> or <c>millivolts</c>. Exit code 0 on success, 2 for bad arguments or a
/// reading outside the sensor's valid range (the message on stderr names the range).
/// </summary>
public static class ConvertCommand
{
    /// <summary>Exit code of a successful conversion.</summary>
    public const int ExitOk = 0;

    /// <summary>Exit code for bad arguments and readings outside the valid range.</summary>
    public const int ExitBadInput = 2;

    /// <summary>
    /// Builds the command. Output goes to <paramref name="stdout"/> and <paramref name="stderr"/> when given,
    /// otherwise to the invocation's configured writers (the console by default).
    /// </summary>
    public static Command Create(TextWriter? stdout = null, TextWriter? stderr = null)
    {
        var action = new ConvertAction(stdout, stderr);
        var command = new Command(
            "convert",
            "Convert a reference sensor reading (Ω or mV) to °C, or with --celsius a temperature to the reading.")
        {
            action.Sensor,
            action.Value,
            action.Celsius,
            action.A,
            action.B,
            action.C,
            action.R25,
            action.Beta,
            action.ColdJunction,
            action.Json,
        };
        command.Action = action;
        return command;
    }
}
