using LineTest.TestSupport;
using LineTest.Core.Fixtures;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Fixtures;

public sealed class FixtureLoaderTests
{
    private const string File = "bad-fixture.json";

    /// <summary>One edit of the valid base fixture and where and why the loader must complain.</summary>
    private sealed record BadFixture(string Find, string Replace, string LineMarker, string Path, string Reason, int ProblemCount = 1);

    private static readonly Dictionary<string, BadFixture> BadFixtures = new(StringComparer.Ordinal)
    {
        ["safe minimum above maximum"] = new("\"safeMinC\": -30,", "\"safeMinC\": 130,", "safeMinC", "$.source.safeMinC",
            "the safe minimum (130 °C) must be below the safe maximum (125 °C)"),
        ["standby below the safe range"] = new("\"standbyC\": 23,", "\"standbyC\": -40,", "standbyC", "$.source.standbyC",
            "standby -40 °C is outside the safe range -30 … 125 °C"),
        ["standby above the safe range"] = new("\"standbyC\": 23,", "\"standbyC\": 125.5,", "standbyC", "$.source.standbyC",
            "standby 125.5 °C is outside the safe range -30 … 125 °C"),
        ["duplicate slot"] = new("{ \"slot\": 2,", "{ \"slot\": 1,", "\"outputChannel\": 102", "$.slots[1].slot", "slot 1 is defined twice"),
        ["slot number zero"] = new("{ \"slot\": 1,", "{ \"slot\": 0,", "\"outputChannel\": 101", "$.slots[0].slot", "must be a whole number 1 … 64, not 0"),
        ["output channel wired twice"] = new("\"outputChannel\": 102", "\"outputChannel\": 101", "\"slot\": 2", "$.slots[1].outputChannel",
            "meter channel 101 is already wired to the output of slot 1"),
        ["supply channel on another slot's output"] = new("\"supplyChannel\": 113", "\"supplyChannel\": 102", "\"slot\": 3", "$.slots[2].supplyChannel",
            "meter channel 102 is already wired to the output of slot 2"),
        ["output and supply on one channel"] = new("\"supplyChannel\": 114", "\"supplyChannel\": 104", "\"slot\": 4", "$.slots[3].supplyChannel",
            "meter channel 104 is already wired to the output of slot 4"),
        ["zero heating rate"] = new("\"rampUpCPerMinute\": 15,", "\"rampUpCPerMinute\": 0,", "rampUpCPerMinute", "$.source.rampUpCPerMinute",
            "must be a number above 0 and at most 1000 °C/min, not 0"),
        ["negative cooling rate"] = new("\"rampDownCPerMinute\": 10,", "\"rampDownCPerMinute\": -10,", "rampDownCPerMinute", "$.source.rampDownCPerMinute",
            "must be a number above 0 and at most 1000 °C/min, not -10"),
        ["unknown source kind"] = new("\"kind\": \"dry-block\"", "\"kind\": \"dryblock\"", "\"dryblock\"", "$.source.kind", "unknown source kind 'dryblock'"),
        ["unknown rig"] = new("\"rig\": \"simulator\"", "\"rig\": \"sim\"", "\"rig\"", "$.rig", "unknown rig 'sim' (known: simulator, serial)"),
        ["zero shunt"] = new("\"supplyChannel\": 112, \"supplyShuntOhms\": 10", "\"supplyChannel\": 112, \"supplyShuntOhms\": 0", "\"slot\": 2", "$.slots[1].supplyShuntOhms",
            "must be a number above 0 and at most 1000000000 Ω, not 0"),
        ["zero meter range"] = new("\"rangeVolts\": 10,", "\"rangeVolts\": 0,", "rangeVolts", "$.meter.rangeVolts", "must be a number above 0 and at most 1000 V, not 0"),
        ["defect rate above one"] = new("\"defectRate\": 0.04", "\"defectRate\": 4", "defectRate", "$.simulation.defectRate", "must be a number 0 … 1, not 4"),
        ["more slot offsets than slots"] = new("[ 0.0, 0.01, -0.01, 0.02 ]", "[ 0.0, 0.01, -0.01, 0.02, 0.03 ]", "slotOffsetsC", "$.simulation.slotOffsetsC", "more offsets (5) than slots (4)"),
        ["well offset beyond its bound"] = new("\"supplyChannel\": 114, \"supplyShuntOhms\": 10 }", "\"supplyChannel\": 114, \"supplyShuntOhms\": 10, \"wellOffsetC\": 12 }", "\"slot\": 4", "$.slots[3].wellOffsetC", "must be a number -10 … 10 °C, not 12"),
        ["misspelt key"] = new("\"standbyC\": 23,", "\"standbyTempC\": 23,", "standbyTempC", "$.source.standbyTempC", "unknown property 'standbyTempC'", ProblemCount: 2),
        ["string where a whole number is"] = new("\"outputChannel\": 103", "\"outputChannel\": \"103\"", "\"slot\": 3", "$.slots[2].outputChannel", "expected a whole number"),
        ["missing required source property"] = new("    \"standbyC\": 23,\n", string.Empty, "\"source\": {", "$.source", "missing required property 'standbyC'"),
    };

    public static TheoryData<string> BadFixtureNames => new(BadFixtures.Keys);

    [Fact]
    public void LoadFile_ShippedFixture_LoadsWithoutProblems()
    {
        var result = DefinitionFile.Fixture(TestFiles.ShippedFixturePath);

        Assert.Empty(result.Problems);
        Assert.True(result.IsSuccess);
        Assert.Equal("sim-dryblock-4", result.Value.Id);
        Assert.Equal([1, 2, 3, 4], result.Value.Slots.Select(s => s.Slot));
        Assert.Equal(-30, result.Value.Source.SafeMinC);
        Assert.Equal(125, result.Value.Source.SafeMaxC);
        Assert.Equal("prt", result.Value.Reference.Sensor.Kind);
    }

    [Fact]
    public void Load_BaseTestFixture_LoadsWithoutProblems()
    {
        Assert.Empty(FixtureLoader.Load(File, TestFiles.Utf8(TestFiles.FixtureBase)).Problems);
    }

    [Theory]
    [MemberData(nameof(BadFixtureNames))]
    public void Load_BadFixture_ReportsLinePathAndReason(string name)
    {
        var bad = BadFixtures[name];
        var text = TestFiles.Edit(TestFiles.FixtureBase, bad.Find, bad.Replace);

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        Assert.False(result.IsSuccess);
        var problem = Assert.Single(result.Problems, p => p.JsonPath == bad.Path);
        Assert.Equal(File, problem.File);
        Assert.Equal(TestFiles.LineOf(text, bad.LineMarker), problem.Line);
        Assert.Contains(bad.Reason, problem.Reason, StringComparison.Ordinal);
        Assert.Equal(bad.ProblemCount, result.Problems.Count);
    }

    [Fact]
    public void Load_SerialRigWithoutPorts_ReportsEveryMissingPortAtItsObject()
    {
        var text = TestFiles.Edit(TestFiles.FixtureBase, "\"rig\": \"simulator\"", "\"rig\": \"serial\"");

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        Assert.Equal(
            [
                ("$.source", TestFiles.LineOf(text, "\"source\""), "a serial rig needs the source's port"),
                ("$.reference", TestFiles.LineOf(text, "\"reference\""), "a serial rig needs the reference readout's port"),
                ("$.meter", TestFiles.LineOf(text, "\"meter\""), "a serial rig needs the meter's port"),
                ("$.slots[0].unitPort", TestFiles.LineOf(text, "\"slot\": 1"), "a serial rig needs each slot's unit port"),
                ("$.slots[1].unitPort", TestFiles.LineOf(text, "\"slot\": 2"), "a serial rig needs each slot's unit port"),
                ("$.slots[2].unitPort", TestFiles.LineOf(text, "\"slot\": 3"), "a serial rig needs each slot's unit port"),
                ("$.slots[3].unitPort", TestFiles.LineOf(text, "\"slot\": 4"), "a serial rig needs each slot's unit port"),
            ],
            result.Problems.Select(p => (p.JsonPath, p.Line ?? -1, p.Reason)));
    }

    [Fact]
    public void Load_SerialRigWithEveryPort_LoadsWithoutProblems()
    {
        var text = TestFiles.FixtureBase;
        text = TestFiles.Edit(text, "\"rig\": \"simulator\"", "\"rig\": \"serial\"");
        text = TestFiles.Edit(text, "\"settlingTimeConstantSeconds\": 40", "\"settlingTimeConstantSeconds\": 40, \"port\": { \"name\": \"/dev/ttyUSB0\" }");
        text = TestFiles.Edit(text, "\"readoutResolution\": 0.0001", "\"readoutResolution\": 0.0001, \"port\": { \"name\": \"/dev/ttyUSB1\", \"baud\": 19200 }");
        text = TestFiles.Edit(text, "\"integrationPlc\": 1", "\"integrationPlc\": 1, \"port\": { \"name\": \"/dev/ttyUSB2\" }");
        for (var slot = 1; slot <= 4; slot++)
        {
            text = TestFiles.Edit(text, $"\"supplyChannel\": 11{slot}, \"supplyShuntOhms\": 10", $"\"supplyChannel\": 11{slot}, \"supplyShuntOhms\": 10, \"unitPort\": {{ \"name\": \"/dev/ttyS{slot}\" }}");
        }

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        Assert.Empty(result.Problems);
        Assert.Equal(19200, result.Value!.Reference.Port!.Baud);
        Assert.Equal(9600, result.Value.Source.Port!.Baud);
    }

    [Fact]
    public void Load_SafeMinimumAboveMaximum_DoesNotAlsoJudgeTheStandby()
    {
        // With no valid range there is nothing to judge the standby against: one problem, not two.
        var text = TestFiles.Edit(TestFiles.FixtureBase, "\"safeMinC\": -30,", "\"safeMinC\": 200,");

        Assert.Single(FixtureLoader.Load(File, TestFiles.Utf8(text)).Problems);
    }

    [Fact]
    public void Load_SeveralProblems_ReportsEveryOneWithItsOwnLine()
    {
        var text = TestFiles.FixtureBase;
        text = TestFiles.Edit(text, "\"standbyC\": 23,", "\"standbyC\": 200,");
        text = TestFiles.Edit(text, "\"rampUpCPerMinute\": 15,", "\"rampUpCPerMinute\": 0,");
        text = TestFiles.Edit(text, "{ \"slot\": 4,", "{ \"slot\": 3,");

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        Assert.Equal(
            [
                ("$.source.standbyC", TestFiles.LineOf(text, "standbyC")),
                ("$.source.rampUpCPerMinute", TestFiles.LineOf(text, "rampUpCPerMinute")),
                ("$.slots[3].slot", TestFiles.LineOf(text, "\"outputChannel\": 104")),
            ],
            result.Problems.Select(p => (p.JsonPath, p.Line ?? -1)));
    }

    [Fact]
    public void Load_ExtraCheck_IsRunAndItsProblemsLocated()
    {
        var result = FixtureLoader.Load(File, TestFiles.Utf8(TestFiles.FixtureBase),
            (fixture, problems) => problems.AddIf(fixture.Reference.Sensor.R0 == 100.0, "$.reference.sensor.r0", "a Pt1000 is required here"));

        var problem = Assert.Single(result.Problems);
        Assert.Equal(TestFiles.LineOf(TestFiles.FixtureBase, "\"sensor\""), problem.Line);
        Assert.Equal("a Pt1000 is required here", problem.Reason);
    }

    [Fact]
    public void Load_SerialScanner_LoadsWithItsPort()
    {
        var text = WithScanner("{ \"kind\": \"serial\", \"port\": { \"name\": \"/dev/ttyACM0\", \"baud\": 9600, \"timeoutMs\": 300 } }");

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        Assert.Empty(result.Problems);
        Assert.Equal("serial", result.Value!.Scanner!.Kind);
        Assert.Equal("/dev/ttyACM0", result.Value.Scanner.Port!.Name);
        Assert.Equal(300, result.Value.Scanner.Port.TimeoutMs);
    }

    [Fact]
    public void Load_NoScanner_KeyboardByDefault() => Assert.Null(FixtureLoader.Load(File, TestFiles.Utf8(TestFiles.FixtureBase)).Value!.Scanner);

    public static TheoryData<string, string, string> BadScanners => new()
    {
        { "{ \"kind\": \"serial\" }", "$.scanner", "a serial scanner needs its port" },
        { "{ \"kind\": \"keyboard\", \"port\": { \"name\": \"/dev/ttyACM0\" } }", "$.scanner.port", "a keyboard scanner has no port" },
        { "{ \"kind\": \"usb\" }", "$.scanner.kind", "unknown scanner kind 'usb' (known: keyboard, serial)" },
        { "{ \"kind\": \"serial\", \"port\": { \"name\": \" \" } }", "$.scanner.port.name", "the port needs a name" },
        { "{ \"kind\": \"serial\", \"port\": { \"name\": \"/dev/ttyACM0\", \"baud\": 0 } }", "$.scanner.port.baud", "must be a whole number 50 … 4000000 Bd, not 0" },
        { "{ \"kind\": \"serial\", \"port\": { \"name\": \"/dev/ttyACM0\", \"timeoutMs\": 0 } }", "$.scanner.port.timeoutMs", "must be a whole number 1 … 60000 ms, not 0" },
        { "{ \"port\": { \"name\": \"/dev/ttyACM0\" } }", "$.scanner", "missing required property 'kind'" },
    };

    [Theory]
    [MemberData(nameof(BadScanners))]
    public void Load_BadScanner_ReportsLinePathAndReason(string scanner, string path, string reason)
    {
        var text = WithScanner(scanner);

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        var problem = Assert.Single(result.Problems);
        Assert.Equal(path, problem.JsonPath);
        Assert.Equal(TestFiles.LineOf(text, "\"scanner\""), problem.Line);
        Assert.Contains(reason, problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_InstrumentPortWithZeroBaud_ReportedAtThePort()
    {
        // Before, a zero baud rate reached the serial driver, whose argument check then stopped the station.
        var text = TestFiles.Edit(TestFiles.FixtureBase, "\"settlingTimeConstantSeconds\": 40", "\"settlingTimeConstantSeconds\": 40,\n    \"port\": { \"name\": \"/dev/ttyUSB0\", \"baud\": 0 }");

        var problem = Assert.Single(FixtureLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal("$.source.port.baud", problem.JsonPath);
        Assert.Equal(TestFiles.LineOf(text, "\"baud\": 0"), problem.Line);
    }

    // The scanner object on a line of its own, before the slots.
    private static string WithScanner(string scanner)
        => TestFiles.Edit(TestFiles.FixtureBase, "  \"slots\": [", $"  \"scanner\": {scanner},\n  \"slots\": [");
}
