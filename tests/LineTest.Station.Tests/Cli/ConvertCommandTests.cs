using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using LineTest.Station.Cli;

namespace LineTest.Station.Tests.Cli;

public sealed class ConvertCommandTests
{
    [Theory]
    [InlineData("pt100", "138.5055", 100.0, 0.001)] // IEC 60751:2008, Pt100 R(100 °C) unrounded [derived]
    [InlineData("pt100", "18.5201", -200.0, 0.001)] // IEC 60751:2008, Pt100 R(−200 °C) unrounded [derived]
    [InlineData("pt1000", "1385.055", 100.0, 0.001)] // IEC 60751:2008, Pt1000 = 10 × Pt100 [derived]
    [InlineData("type-k", "14.293", 350.0, 0.02)] // NIST Monograph 175, type K table, 350 °C [published]
    [InlineData("type-t", "-5.603", -200.0, 0.04)] // NIST Monograph 175, type T table, −200 °C [published]
    public void Invoke_Reading_PrintsCelsius(string sensor, string value, double expectedC, double toleranceC)
    {
        var run = Run("convert", sensor, value);

        Assert.Equal(ConvertCommand.ExitOk, run.ExitCode);
        Assert.Equal(string.Empty, run.Stderr);
        Assert.EndsWith(" °C", run.Stdout.TrimEnd(), StringComparison.Ordinal);
        Assert.Equal(expectedC, ParseLeadingNumber(run.Stdout), toleranceC);
    }

    [Theory]
    [InlineData("pt100", "100", "138.5055 Ω")] // IEC 60751:2008, Pt100 R(100 °C) = 138.5055 Ω [derived]
    [InlineData("pt100", "-50", "80.3063 Ω")] // IEC 60751:2008 table 80.31 Ω [published]; unrounded [derived]
    [InlineData("type-k", "1372", "54.8864 mV")] // NIST Monograph 175 type K table 54.886 mV [published]
    [InlineData("type-t", "400", "20.8720 mV")] // NIST Monograph 175 type T table 20.872 mV [published]
    public void Invoke_Celsius_PrintsReading(string sensor, string celsius, string expected)
    {
        var run = Run("convert", sensor, "--celsius", celsius);

        Assert.Equal(ConvertCommand.ExitOk, run.ExitCode);
        Assert.Equal(expected, run.Stdout.TrimEnd());
    }

    [Theory]
    [InlineData("type-t", "20.872", 400.0)] // Regression: convert printed 20.872 mV as the range end and then refused it.
    [InlineData("type-t", "20.8720", 400.0)] // as convert type-t --celsius 400 prints it
    [InlineData("type-k", "54.8864", 1372.0)]
    [InlineData("pt1000", "3904.8113", 850.0)]
    [InlineData("pt100", "18.5201", -200.0)]
    public void Invoke_RangeEndAsPrinted_IsAccepted(string sensor, string value, double expectedC)
    {
        var run = Run("convert", sensor, value);

        Assert.Equal(ConvertCommand.ExitOk, run.ExitCode);
        Assert.Equal(expectedC, ParseLeadingNumber(run.Stdout), 0.0002);
    }

    [Theory]
    [InlineData("pt100")]
    [InlineData("pt1000")]
    [InlineData("type-k")]
    [InlineData("type-t")]
    public void Invoke_EveryRangeEndItPrints_IsAcceptedBack(string sensor)
    {
        var refused = Run("convert", sensor, "1e9");
        var range = System.Text.RegularExpressions.Regex.Match(refused.Stderr, @"valid range (?<low>-?[0-9.]+) to (?<high>-?[0-9.]+) ");

        Assert.True(range.Success, refused.Stderr);
        foreach (var end in new[] { range.Groups["low"].Value, range.Groups["high"].Value })
        {
            var run = Run("convert", sensor, "--", end);
            Assert.True(run.ExitCode == ConvertCommand.ExitOk, $"{sensor} {end}: {run.Stderr}");
        }

        Assert.Equal(ConvertCommand.ExitBadInput, Run("convert", sensor, "--", range.Groups["high"].Value + "9").ExitCode);
    }

    [Fact]
    public void Invoke_NtcSteinhartHart_ConvertsPublishedPoint()
    {
        // Published 10 kΩ NTC Steinhart–Hart set: 32 650.9 Ω ↔ 0.00 °C [published].
        var run = Run("convert", "ntc", "32650.9", "--a", "1.129148e-3", "--b", "2.34125e-4", "--c", "8.76741e-8");

        Assert.Equal(ConvertCommand.ExitOk, run.ExitCode);
        Assert.Equal(0.0, ParseLeadingNumber(run.Stdout), 0.001);
    }

    [Fact]
    public void Invoke_NtcBetaModel_ConvertsR25ToTwentyFive()
    {
        // Beta model: R(25 °C) = R25 by definition [published].
        var run = Run("convert", "ntc", "10000", "--r25", "10000", "--beta", "3950");

        Assert.Equal("25.0000 °C", run.Stdout.TrimEnd());
    }

    [Fact]
    public void Invoke_ThermocoupleWithColdJunction_CompensatesIt()
    {
        // NIST Monograph 175 type K table [from memory]: E(100 °C) − E(25 °C) = 4.096 − 1.000 = 3.096 mV.
        var run = Run("convert", "type-k", "3.096", "--cold-junction", "25");

        Assert.Equal(ConvertCommand.ExitOk, run.ExitCode);
        Assert.Equal(100.0, ParseLeadingNumber(run.Stdout), 0.025);
    }

    [Fact]
    public void Invoke_Json_PrintsSensorCelsiusAndOhms()
    {
        var run = Run("convert", "pt100", "--celsius", "100", "--json");

        Assert.Equal(ConvertCommand.ExitOk, run.ExitCode);
        using var document = JsonDocument.Parse(run.Stdout);
        var root = document.RootElement;
        Assert.Equal(["sensor", "celsius", "ohms"], root.EnumerateObject().Select(p => p.Name));
        Assert.Equal("pt100", root.GetProperty("sensor").GetString());
        Assert.Equal(100.0, root.GetProperty("celsius").GetDouble());

        // IEC 60751:2008, Pt100 R(100 °C) = 138.5055 Ω [derived].
        Assert.Equal(138.5055, root.GetProperty("ohms").GetDouble());
    }

    [Fact]
    public void Invoke_JsonThermocouple_PrintsMillivolts()
    {
        // NIST Monograph 175 type T table: 350 °C → 17.819 mV [published].
        var run = Run("convert", "type-t", "17.819", "--json");

        using var document = JsonDocument.Parse(run.Stdout);
        Assert.Equal(["sensor", "celsius", "millivolts"], document.RootElement.EnumerateObject().Select(p => p.Name));
        Assert.Equal(17.819, document.RootElement.GetProperty("millivolts").GetDouble());
        Assert.Equal(350.0, document.RootElement.GetProperty("celsius").GetDouble(), 0.02);
    }

    [Fact]
    public void Invoke_ReadingOutOfRange_ExitsTwoNamingTheRange()
    {
        var run = Run("convert", "pt100", "400");

        Assert.Equal(ConvertCommand.ExitBadInput, run.ExitCode);
        Assert.Equal(string.Empty, run.Stdout);
        Assert.Contains("18.5201 to 390.4811 Ω", run.Stderr, StringComparison.Ordinal);
        Assert.Contains("-200 to 850 °C", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Invoke_TemperatureOutOfRange_ExitsTwoNamingTheRange()
    {
        var run = Run("convert", "type-t", "--celsius", "500");

        Assert.Equal(ConvertCommand.ExitBadInput, run.ExitCode);
        Assert.Contains("-270 to 400 °C", run.Stderr, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(new[] { "convert" }, "SENSOR is required")]
    [InlineData(new[] { "convert", "pt25", "10" }, "SENSOR 'pt25' is not one of")]
    [InlineData(new[] { "convert", "pt100" }, "give VALUE")]
    [InlineData(new[] { "convert", "pt100", "100", "--celsius", "0" }, "not both")]
    [InlineData(new[] { "convert", "pt100", "abc" }, "VALUE: 'abc' is not a number")]
    [InlineData(new[] { "convert", "pt100", "100,5" }, "VALUE: '100,5' is not a number")]
    [InlineData(new[] { "convert", "pt100", "--celsius" }, "--celsius needs a number")]
    [InlineData(new[] { "convert", "pt100", "--celsius", "1", "--celsius", "2" }, "--celsius was given 2 times")]
    [InlineData(new[] { "convert", "pt100", "100", "extra" }, "unexpected argument 'extra'")]
    [InlineData(new[] { "convert", "pt100", "100", "--r25", "10000" }, "--r25 does not apply to pt100")]
    [InlineData(new[] { "convert", "type-k", "1", "--a", "1e-3" }, "--a does not apply to type-k")]
    [InlineData(new[] { "convert", "ntc", "1000" }, "--a, --b, --c / --r25, --beta:")]
    [InlineData(new[] { "convert", "ntc", "1000", "--a", "1e-3", "--b", "2e-4" }, "--c: required")]
    [InlineData(new[] { "convert", "ntc", "1000", "--r25", "10000", "--beta", "-5" }, "--beta: must be a positive")]
    [InlineData(new[] { "convert", "type-t", "1", "--cold-junction", "900" }, "--cold-junction: 900 °C is outside")]
    [InlineData(new[] { "convert", "pt100", "100", "--a", "-1" }, "--a, --b, --c: resistance must rise")]
    public void Invoke_BadArguments_ExitsTwoWithMessage(string[] args, string expected)
    {
        var run = Run(args);

        Assert.Equal(ConvertCommand.ExitBadInput, run.ExitCode);
        Assert.Equal(string.Empty, run.Stdout);
        Assert.Contains(expected, run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Invoke_Pt100WithCertificateCoefficients_UsesThem()
    {
        // With A = 0.004, B = C = 0: R(100 °C) = 100·(1 + 0.4) = 140 Ω (Callendar–Van Dusen, IEC 60751 form) [derived].
        var run = Run("convert", "pt100", "--celsius", "100", "--a", "0.004", "--b", "0", "--c", "0");

        Assert.Equal("140.0000 Ω", run.Stdout.TrimEnd());
    }

    [Fact]
    public void Invoke_NegativeReading_IsAValueNotAnOption()
    {
        // NIST Monograph 175 type K table: −50 °C → −1.889 mV [published].
        var run = Run("convert", "type-k", "-1.889");

        Assert.Equal(ConvertCommand.ExitOk, run.ExitCode);
        Assert.Equal(-50.0, ParseLeadingNumber(run.Stdout), 0.04);
    }

    [Fact]
    public void Invoke_Help_DescribesSensorsAndExitsZero()
    {
        var run = Run("convert", "--help");

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("--cold-junction", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("type-k", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Create_WithoutWriters_UsesInvocationConfiguration()
    {
        var root = new RootCommand { ConvertCommand.Create() };
        var stdout = new StringWriter();
        var stderr = new StringWriter();

        var exitCode = root.Parse(["convert", "pt100", "100"]).Invoke(new InvocationConfiguration { Output = stdout, Error = stderr });

        Assert.Equal(0, exitCode);
        Assert.Equal("0.0000 °C", stdout.ToString().TrimEnd());
    }

    private static double ParseLeadingNumber(string output) =>
        double.Parse(output.Trim().Split(' ')[0], NumberStyles.Float, CultureInfo.InvariantCulture);

    private static RunResult Run(params string[] args)
    {
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        var root = new RootCommand { ConvertCommand.Create(stdout, stderr) };

        // The help action writes to the invocation's output; route it to the same writer.
        var exitCode = root.Parse(args).Invoke(new InvocationConfiguration { Output = stdout, Error = stderr });
        return new RunResult(exitCode, stdout.ToString(), stderr.ToString());
    }

    private sealed record RunResult(int ExitCode, string Stdout, string Stderr);
}
