using System.CommandLine;
using System.CommandLine.Invocation;
using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.RegularExpressions;
using LineTest.Core.Fixtures;
using LineTest.Core.Thermometry;

namespace LineTest.Station.Cli;

/// <summary>
/// The work of <c>linetest convert</c>. It takes every value as text and checks it itself, and it claims the
/// parse errors of its command, so that every bad argument ends with exit code 2 and a message naming the
/// argument, instead of the parser's generic error exit.
/// </summary>
internal sealed partial class ConvertAction : SynchronousCommandLineAction
{
    private static readonly string[] SensorNames = ["pt100", "pt1000", "type-k", "type-t", "ntc"];

    private readonly TextWriter? _stdout;
    private readonly TextWriter? _stderr;

    public ConvertAction(TextWriter? stdout, TextWriter? stderr)
    {
        _stdout = stdout;
        _stderr = stderr;
    }

    public Argument<string?> Sensor { get; } = new("sensor")
    {
        Arity = ArgumentArity.ZeroOrOne,
        HelpName = "SENSOR",
        Description = "pt100, pt1000 (IEC 60751), type-k, type-t (NIST ITS-90) or ntc (Steinhart-Hart or beta model).",
    };

    public Argument<string?> Value { get; } = new("value")
    {
        Arity = ArgumentArity.ZeroOrOne,
        HelpName = "VALUE",
        Description = "The reading: ohms for pt100, pt1000 and ntc; millivolts for type-k and type-t.",
    };

    public Option<string[]> Celsius { get; } = NumberOption("--celsius", "T", "Convert this temperature, °C, to the sensor's reading instead.");

    public Option<string[]> A { get; } = NumberOption("--a", "A", "ntc: Steinhart-Hart A; pt100/pt1000: certificate Callendar-Van Dusen A (default IEC 60751).");

    public Option<string[]> B { get; } = NumberOption("--b", "B", "ntc: Steinhart-Hart B; pt100/pt1000: certificate Callendar-Van Dusen B (default IEC 60751).");

    public Option<string[]> C { get; } = NumberOption("--c", "C", "ntc: Steinhart-Hart C; pt100/pt1000: certificate Callendar-Van Dusen C (default IEC 60751).");

    public Option<string[]> R25 { get; } = NumberOption("--r25", "OHMS", "ntc beta model: resistance at 25 °C, Ω.");

    public Option<string[]> Beta { get; } = NumberOption("--beta", "K", "ntc beta model: beta, K.");

    public Option<string[]> ColdJunction { get; } = NumberOption("--cold-junction", "C", "type-k, type-t: cold-junction temperature, °C (default 0).");

    public Option<bool> Json { get; } = new("--json") { Description = "Print one JSON object: sensor, celsius and ohms or millivolts." };

    public override bool ClearsParseErrors => true;

    public override int Invoke(ParseResult parseResult)
    {
        ArgumentNullException.ThrowIfNull(parseResult);
        var stdout = _stdout ?? parseResult.InvocationConfiguration.Output;
        var stderr = _stderr ?? parseResult.InvocationConfiguration.Error;

        var errors = new List<string>();
        errors.AddRange(parseResult.Errors.Select(e => e.Message));
        errors.AddRange(parseResult.UnmatchedTokens.Select(t => $"unexpected argument '{t}'"));

        var sensorName = parseResult.GetValue(Sensor)?.Trim().ToLowerInvariant();
        var value = ReadNumber(parseResult.GetValue(Value), "VALUE", errors);
        var celsius = ReadOption(parseResult, Celsius, errors);
        var a = ReadOption(parseResult, A, errors);
        var b = ReadOption(parseResult, B, errors);
        var c = ReadOption(parseResult, C, errors);
        var r25 = ReadOption(parseResult, R25, errors);
        var beta = ReadOption(parseResult, Beta, errors);
        var coldJunction = ReadOption(parseResult, ColdJunction, errors);

        ReferenceSensorDefinition? definition = null;
        switch (sensorName)
        {
            case null or "":
                errors.Add($"SENSOR is required: {string.Join(", ", SensorNames)}");
                break;
            case "pt100" or "pt1000":
                RejectOptions(errors, sensorName, (R25, r25), (Beta, beta), (ColdJunction, coldJunction));
                definition = new ReferenceSensorDefinition
                {
                    Kind = "prt",
                    R0 = sensorName == "pt100" ? 100.0 : 1000.0,
                    A = a,
                    B = b,
                    C = c,
                };
                break;
            case "type-k" or "type-t":
                RejectOptions(errors, sensorName, (A, a), (B, b), (C, c), (R25, r25), (Beta, beta));
                definition = new ReferenceSensorDefinition
                {
                    Kind = "thermocouple",
                    Type = sensorName == "type-k" ? "K" : "T",
                    ColdJunctionC = coldJunction ?? 0.0,
                };
                break;
            case "ntc":
                RejectOptions(errors, sensorName, (ColdJunction, coldJunction));
                definition = new ReferenceSensorDefinition { Kind = "thermistor", A = a, B = b, C = c, R25 = r25, Beta = beta };
                break;
            default:
                errors.Add($"SENSOR '{sensorName}' is not one of {string.Join(", ", SensorNames)}");
                break;
        }

        var hasValue = parseResult.GetValue(Value) is not null;
        var hasCelsius = parseResult.GetResult(Celsius) is not null;
        if (hasValue && hasCelsius)
        {
            errors.Add("give either VALUE (a reading to convert to °C) or --celsius (a temperature to convert), not both");
        }
        else if (!hasValue && !hasCelsius)
        {
            errors.Add("give VALUE (a reading in Ω or mV) or --celsius T");
        }

        if (errors.Count > 0 || definition is null)
        {
            return Fail(stderr, errors, showUsageHint: true);
        }

        var created = ReferenceSensorFactory.Create(definition);
        if (!created.IsSuccess)
        {
            return Fail(stderr, created.Errors.Select(OptionNamesFor), showUsageHint: true);
        }

        var sensor = created.Sensor;
        var toCelsius = hasValue;
        var result = toCelsius ? ToCelsiusAtPrintedEnds(sensor, value!.Value) : sensor.FromCelsius(celsius!.Value);
        if (!result.IsSuccess)
        {
            return Fail(stderr, [result.Error], showUsageHint: false);
        }

        var celsiusOut = toCelsius ? result.Value : celsius!.Value;
        var rawOut = toCelsius ? value!.Value : result.Value;
        var isThermocouple = sensor.RawUnit == RawUnits.Millivolt;
        if (parseResult.GetValue(Json))
        {
            stdout.WriteLine(ToJson(sensorName!, celsiusOut, isThermocouple ? "millivolts" : "ohms", rawOut));
        }
        else
        {
            stdout.WriteLine(toCelsius
                ? $"{Format(celsiusOut)} °C"
                : $"{Format(rawOut)} {(isThermocouple ? "mV" : "Ω")}");
        }

        return ConvertCommand.ExitOk;
    }

    /// <summary>
    /// The reading in °C; a reading that is a range end as convert prints it (four decimals, e.g. 20.872 mV for type T
    /// at 400 °C) is taken as that end, so every value convert prints is accepted back.
    /// </summary>
    private static ConversionResult ToCelsiusAtPrintedEnds(IReferenceSensor sensor, double raw)
    {
        var result = sensor.ToCelsius(raw);
        if (result.IsSuccess)
        {
            return result;
        }

        foreach (var endC in new[] { sensor.MinC, sensor.MaxC })
        {
            if (sensor.FromCelsius(endC) is { IsSuccess: true } end && Printed(raw) == Printed(end.Value))
            {
                // The end itself, or the nearest value inside the range when the end's own rounding (°C to raw and
                // back) puts it a hair outside: moved inward by growing relative steps, far below the printed digit.
                var inward = raw > end.Value ? -1.0 : 1.0;
                for (var k = 0; k <= 30; k++)
                {
                    var candidate = k == 0 ? end.Value : end.Value + (inward * Math.Max(Math.Abs(end.Value), 1) * Math.ScaleB(1e-16, k));
                    if (sensor.ToCelsius(candidate) is { IsSuccess: true } atEnd)
                    {
                        return atEnd;
                    }
                }
            }
        }

        return result;
    }

    /// <summary>A reading as convert prints a range end (four decimals at most, invariant culture).</summary>
    private static string Printed(double value) => value.ToString("0.####", CultureInfo.InvariantCulture);

    private static Option<string[]> NumberOption(string name, string helpName, string description) => new(name)
    {
        // Zero or more values, checked in Invoke: the parser's own arity errors would exit with its generic code.
        Arity = ArgumentArity.ZeroOrMore,
        AllowMultipleArgumentsPerToken = false,
        HelpName = helpName,
        Description = description,
    };

    private static double? ReadOption(ParseResult parseResult, Option<string[]> option, List<string> errors)
    {
        if (parseResult.GetResult(option) is null)
        {
            return null;
        }

        var values = parseResult.GetValue(option) ?? [];
        switch (values.Length)
        {
            case 0:
                errors.Add($"{option.Name} needs a number");
                return null;
            case > 1:
                errors.Add($"{option.Name} was given {values.Length} times; give it once");
                return null;
            default:
                return ReadNumber(values[0], option.Name, errors);
        }
    }

    private static double? ReadNumber(string? text, string name, List<string> errors)
    {
        if (text is null)
        {
            return null;
        }

        // Invariant culture: a station's scripts must not change meaning with the PC's regional settings.
        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var number) && double.IsFinite(number))
        {
            return number;
        }

        errors.Add($"{name}: '{text}' is not a number (use a dot as decimal separator, e.g. 138.5055)");
        return null;
    }

    private static void RejectOptions(List<string> errors, string sensorName, params (Option<string[]> Option, double? Value)[] options)
    {
        foreach (var (option, value) in options)
        {
            if (value is not null)
            {
                errors.Add($"{option.Name} does not apply to {sensorName}");
            }
        }
    }

    // The factory names fixture-file fields ("coldJunctionC: …"); on the command line the user typed options.
    private static string OptionNamesFor(string error)
    {
        var colon = error.IndexOf(':', StringComparison.Ordinal);
        if (colon < 0)
        {
            return error;
        }

        var fields = FieldName().Replace(error[..colon], m => m.Value switch
        {
            "coldJunctionC" => "--cold-junction",
            "a" or "b" or "c" or "r25" or "beta" => "--" + m.Value,
            _ => m.Value,
        });
        return fields + error[colon..];
    }

    private static int Fail(TextWriter stderr, IEnumerable<string> errors, bool showUsageHint)
    {
        foreach (var error in errors)
        {
            stderr.WriteLine($"convert: {error}");
        }

        if (showUsageHint)
        {
            stderr.WriteLine("convert: see 'linetest convert --help'");
        }

        return ConvertCommand.ExitBadInput;
    }

    private static string ToJson(string sensorName, double celsius, string rawKey, double raw)
    {
        using var stream = new MemoryStream();
        using (var json = new Utf8JsonWriter(stream))
        {
            json.WriteStartObject();
            json.WriteString("sensor", sensorName);
            json.WriteNumber("celsius", Rounded(celsius));
            json.WriteNumber(rawKey, Rounded(raw));
            json.WriteEndObject();
        }

        return Encoding.UTF8.GetString(stream.ToArray());
    }

    // Four decimals: 0.1 mK, 0.1 mΩ and 0.1 µV are below any reference readout's resolution. −0 prints as 0.
    private static double Rounded(double value)
    {
        var rounded = Math.Round(value, 4, MidpointRounding.AwayFromZero);
        return rounded == 0 ? 0.0 : rounded;
    }

    private static string Format(double value) => Rounded(value).ToString("F4", CultureInfo.InvariantCulture);

    [GeneratedRegex("[A-Za-z0-9]+")]
    private static partial Regex FieldName();
}
