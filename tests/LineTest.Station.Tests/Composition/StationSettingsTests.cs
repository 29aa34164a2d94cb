using LineTest.Station.Composition;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Composition;

public sealed class StationSettingsTests
{
    // Found when trying the station with a hand-edited settings file: a doubled comma in appsettings.json, or text where
    // a number belongs, ended every command with an unhandled exception (exit 134) and a stack trace.
    [Fact]
    public void Load_FileThatIsNotJson_NamesTheFileAndLine()
    {
        var root = Some.TempDirectory();
        File.WriteAllText(Path.Combine(root, StationSettings.FileName), "{\n  \"Station\": {\n    \"Id\": \"ST-01\",,\n    \"Lot\": null\n  }\n}\n");

        var (configuration, options, error) = StationSettings.Load(root);

        Assert.Null(configuration);
        Assert.Null(options);
        Assert.StartsWith($"{Path.Combine(root, StationSettings.FileName)}:3: the settings file is not valid JSON: ", error, StringComparison.Ordinal);
        Assert.DoesNotContain("LineNumber", error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("\"SimulatorSpeed\": \"fast\"", "Station:SimulatorSpeed (appsettings.json or a LINETEST_ variable): 'fast' is not a number")]
    [InlineData("\"SimulatorSeed\": 4.5", "Station:SimulatorSeed (appsettings.json or a LINETEST_ variable): '4.5' is not a whole number")]
    public void Load_ValueOfTheWrongType_NamesTheKeyAndWhatItMustBe(string setting, string expected)
    {
        var root = Some.TempDirectory();
        File.WriteAllText(Path.Combine(root, StationSettings.FileName), $"{{ \"Station\": {{ {setting} }} }}");

        var (_, options, error) = StationSettings.Load(root);

        Assert.Null(options);
        Assert.Equal(expected, error);
    }

    [Fact]
    public void Load_SoundFile_BindsTheStationSection()
    {
        var root = Some.TempDirectory();
        File.WriteAllText(Path.Combine(root, StationSettings.FileName), "{ \"Station\": { \"Id\": \"ST-07\", \"SimulatorSpeed\": 120 } }");

        var (configuration, options, error) = StationSettings.Load(root);

        Assert.Null(error);
        Assert.NotNull(configuration);
        Assert.Equal("ST-07", options!.Id);
        Assert.Equal(120, options.SimulatorSpeed);
    }

    [Fact]
    public void Load_NoSettingsFile_Defaults()
    {
        var (_, options, error) = StationSettings.Load(Some.TempDirectory());

        Assert.Null(error);
        Assert.Equal(60, options!.SimulatorSpeed);
    }
}
