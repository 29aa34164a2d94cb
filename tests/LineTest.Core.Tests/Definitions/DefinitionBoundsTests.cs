using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;
using LineTest.TestSupport;

namespace LineTest.Core.Tests.Definitions;

/// <summary>
/// The bounds table and the examples of "no input crashes it" that concern sequence and fixture files: each value
/// below passed the check before and then crashed, hung or exhausted memory in a later command.
/// </summary>
public sealed class DefinitionBoundsTests
{
    private const string File = "edited.json";

    public static TheoryData<string, string, string, string> CrashingFixtureValues => new()
    {
        // A negative noise passed the check and crashed the simulator when demo started.
        { "\"blockNoiseC\": 0.002", "\"blockNoiseC\": -1", "$.simulation.blockNoiseC", "must be a number 0 … 1 °C, not -1" },
        // 1e308 s passed the check and crashed dry-run --json (Infinity in JSON) or printed 2147483647:00.
        { "\"settlingTimeConstantSeconds\": 40", "\"settlingTimeConstantSeconds\": 1e308", "$.source.settlingTimeConstantSeconds",
            "must be a number above 0 and at most 3600 s, not 1E+308" },
        { "\"unitLagSpread\": 0.2", "\"unitLagSpread\": -0.2", "$.simulation.unitLagSpread", "must be a number 0 … 0.5, not -0.2" },
        { "\"unitOutputNoiseVolts\": 0.00005", "\"unitOutputNoiseVolts\": -0.00005", "$.simulation.unitOutputNoiseVolts", "must be a number 0 … 1 V" },
        { "\"slotOffsetsC\": [ 0.0, 0.01, -0.01, 0.02 ]", "\"slotOffsetsC\": [ 0.0, 0.01, -0.01, 1e300 ]", "$.simulation.slotOffsetsC[3]", "must be a number -10 … 10 °C" },
        { "\"integrationPlc\": 1", "\"integrationPlc\": 1e9", "$.meter.integrationPlc", "must be a number 0.001 … 100 PLC" },
        { "\"safeMaxC\": 125", "\"safeMaxC\": 1e300", "$.source.safeMaxC", "must be a number -200 … 1000 °C" },
    };

    [Theory]
    [MemberData(nameof(CrashingFixtureValues))]
    public void Fixture_ValueOutsideItsBound_IsAProblemAtItsLine(string find, string replace, string path, string reason)
    {
        var text = TestFiles.Edit(TestFiles.FixtureBase, find, replace);

        var problem = Assert.Single(FixtureLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal(path, problem.JsonPath);
        Assert.Equal(TestFiles.LineOf(text, replace.Split(':')[0]), problem.Line);
        Assert.Contains(reason, problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Sequence_IvSweepWithTwoBillionPoints_IsRefusedWithoutAllocatingTheSweep()
    {
        // Regression: check --fixture built the 2e9 currents (15 GB) to find the largest before reporting the count.
        var text = TestFiles.Edit(ShippedSequence(), "\"setpoint\": \"cal-low\", \"fromAmps\": 1e-6, \"toAmps\": 1e-3, \"points\": 7,",
            "\"setpoint\": \"cal-low\", \"fromAmps\": 1e-6, \"toAmps\": 1e-3, \"points\": 2000000000,");
        var fixture = ShippedFixture();
        var before = GC.GetAllocatedBytesForCurrentThread();

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), fixture);

        var allocated = GC.GetAllocatedBytesForCurrentThread() - before;
        var problem = Assert.Single(result.Problems);
        Assert.Equal("$.steps[3].points", problem.JsonPath);
        Assert.Contains("2000000000", problem.Reason, StringComparison.Ordinal);
        Assert.True(allocated < 50_000_000, $"checking allocated {allocated} bytes");
    }

    [Fact]
    public void SweepCurrents_PointsBeyondTheBound_AllocatesNothing() =>
        Assert.Empty(new IvSweepStep { Setpoint = "x", FromAmps = 1e-6, ToAmps = 1e-3, Points = 2_000_000_000 }.SweepCurrents());

    [Fact]
    public void Sequence_HundredMillionSamples_IsRefused()
    {
        // Regression: samples 1e8 passed check, and dry-run never ended.
        var text = TestFiles.Edit(ShippedSequence(), "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"samples\": 10",
            "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"samples\": 100000000");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text), ShippedFixture()).Problems);

        Assert.Equal("$.steps[4].samples", problem.JsonPath);
        Assert.Equal("must be a whole number 1 … 1000, not 100000000", problem.Reason);
    }

    public static TheoryData<string, string> BadRegisterNames => new()
    {
        // Each passed check and threw mid-batch on a serial rig, where the unit link refuses the name.
        { "gain", "'gain' is not a register name the unit link can carry" },
        { "GA*IN", "'GA*IN' is not a register name the unit link can carry" },
        { "GAIN\\nSTORE", "'GAIN\\u000aSTORE' is not a register name the unit link can carry" },
        { "GAIN\\n", "'GAIN\\u000a' is not a register name" },
        { "GAINREGISTERNUMBER1", "is 19 characters long; at most 16" },
    };

    [Theory]
    [MemberData(nameof(BadRegisterNames))]
    public void Sequence_RegisterNameTheUnitLinkCannotCarry_IsRefusedAtTheRegister(string name, string reason)
    {
        var text = TestFiles.Edit(ShippedSequence(), "\"register\": \"GAIN\"", $"\"register\": \"{name}\"");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text), ShippedFixture()).Problems);

        Assert.Equal("$.trim.dac.gain.register", problem.JsonPath);
        Assert.Contains(reason, problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Sequence_FirmwareRegisterInLowerCase_IsRefusedAtItsPath()
    {
        var path = Path.Combine(Path.GetDirectoryName(TestFiles.ShippedSequencePath)!, "ctp40d-firmware.json");
        var text = TestFiles.Edit(System.IO.File.ReadAllText(path), "{ \"register\": \"C1\"", "{ \"register\": \"c1\"");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text), ShippedFixture()).Problems);

        Assert.Equal("$.trim.firmware.coefficients[1].register", problem.JsonPath);
    }

    [Theory]
    [InlineData("GAIN")]
    [InlineData("C0")]
    [InlineData("OFFSET_2")]
    [InlineData("ABCDEFGHIJKLMNOP")]
    public void RegisterName_NamesTheUnitLinkCarries_AreAdmitted(string name) => Assert.True(DefinitionBounds.RegisterName.Admits(name));

    [Theory]
    [InlineData(0.0, false)]
    [InlineData(1e-300, true)]
    [InlineData(3600.0, true)]
    [InlineData(3600.0001, false)]
    [InlineData(double.NaN, false)]
    [InlineData(double.PositiveInfinity, false)]
    public void TimeConstant_PositiveAndAtMostAnHour(double seconds, bool admitted) =>
        Assert.Equal(admitted, DefinitionBounds.TimeConstantSeconds.Admits(seconds));

    [Fact]
    public void Refusal_NonFiniteValue_SaysSoWithoutPrintingIt() =>
        Assert.Equal("must be a whole number 1 … 1000 (this one is not finite)", DefinitionBounds.Samples.Refusal(double.NaN));

    [Fact]
    public void ForProperty_EveryNumericPropertyOfTheFixtureModelHasABound()
    {
        // The schema and the checks take their bounds from this table: a new number must get a row in it.
        Type[] fixtureTypes = [typeof(SourceDefinition), typeof(MeterDefinition), typeof(ReferenceDefinition), typeof(SlotDefinition),
            typeof(SourceMeterDefinition), typeof(PortDefinition), typeof(SimulationDefinition)];
        var unbounded = fixtureTypes
            .SelectMany(t => t.GetProperties().Select(p => (Type: t, Property: p)))
            .Where(x => IsNumber(x.Property.PropertyType) && DefinitionBounds.ForProperty(x.Type, x.Property.Name) is null)
            .Select(x => $"{x.Type.Name}.{x.Property.Name}")
            .ToList();

        Assert.Empty(unbounded);
    }

    private static bool IsNumber(Type type)
    {
        var t = Nullable.GetUnderlyingType(type) ?? type;
        return t == typeof(double) || t == typeof(int) || t == typeof(long) || t == typeof(IReadOnlyList<double>);
    }

    private static string ShippedSequence() => System.IO.File.ReadAllText(TestFiles.ShippedSequencePath);

    private static FixtureDefinition ShippedFixture() => DefinitionFile.Fixture(TestFiles.ShippedFixturePath).Value!;
}
