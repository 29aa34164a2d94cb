using System.Text;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Sequences.Steps;

public sealed class IvSweepStepKindTests
{
    private const string LowSweep = "\"setpoint\": \"cal-low\", \"fromAmps\": 1e-6, \"toAmps\": 1e-3, \"points\": 7, \"complianceVolts\": 2.5,";

    public static TheoryData<string, string, string, string> BadSweeps => new()
    {
        { LowSweep, "\"setpoint\": \"cal-low\", \"fromAmps\": 1e-6, \"toAmps\": 1e-3, \"points\": 3, \"complianceVolts\": 2.5,", "$.steps[3].points", "must be 4 … 50, not 3" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"fromAmps\": 1e-3, \"toAmps\": 1e-6, \"points\": 7, \"complianceVolts\": 2.5,", "$.steps[3].toAmps", "currents must increase" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"fromAmps\": -1e-6, \"toAmps\": 1e-3, \"points\": 7, \"complianceVolts\": 2.5,", "$.steps[3].fromAmps", "positive number of amperes" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"currentsAmps\": [1e-6, 1e-5, 1e-5, 1e-3],", "$.steps[3].currentsAmps[2]", "currents must increase" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"currentsAmps\": [1e-6, 1e-5, 1e-3],", "$.steps[3].currentsAmps", "at least 4 currents, got 3" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"currentsAmps\": [0, 1e-5, 1e-4, 1e-3],", "$.steps[3].currentsAmps[0]", "positive number of amperes" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"currentsAmps\": [1e-6, 1e-5, 1e-4, 1e-3], \"points\": 4,", "$.steps[3]", "not both" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"complianceVolts\": 2.5,", "$.steps[3]", "give the sweep currents" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"fromAmps\": 1e-6, \"toAmps\": 1e-3, \"points\": 7, \"complianceVolts\": 0,", "$.steps[3].complianceVolts", "positive number of volts" },
        { LowSweep, "\"setpoint\": \"cal-low\", \"fromAmps\": 1e-6, \"toAmps\": 1e-2, \"points\": 7, \"complianceVolts\": 2.5,", "$.steps[3].toAmps", "above the 0.005 A fixture 'sim-dryblock-4' allows" },
        { "\"log10Is\": { \"low\": -19.5, \"high\": -16.5, \"unit\": \"1\" },\n      \"rsOhms\": { \"low\": 0, \"high\": 60, \"unit\": \"ohm\" }", "\"log10Is\": { \"low\": -19.5, \"high\": -16.5, \"unit\": \"1\" },\n      \"rsOhms\": { \"low\": 0, \"high\": 60, \"unit\": \"mV\" }", "$.steps[3].rsOhms.unit", "use ohm, kohm" },
        { "\"n\": { \"low\": 0.98, \"high\": 1.12, \"unit\": \"1\" },\n      \"log10Is\": { \"low\": -19.5", "\"n\": { \"low\": 0.98, \"high\": 1.12, \"unit\": \"V\" },\n      \"log10Is\": { \"low\": -19.5", "$.steps[3].n.unit", "use 1" },
        { "\"maxResidualMillivolts\": { \"high\": 0.5, \"unit\": \"mV\" } },", "\"maxResidualMillivolts\": { \"high\": 0.5, \"unit\": \"ohm\" } },", "$.steps[3].maxResidualMillivolts.unit", "use V, mV, uV" },
        { "\"tempco\": { \"low\": -2.4, \"high\": -1.6, \"unit\": \"mV/degC\" }", "\"tempco\": { \"low\": -2.4, \"high\": -1.6, \"unit\": \"degC\" }", "$.steps[7].tempco.unit", "use mV/degC" },
        { "\"nominalBiasAmps\": 10e-6,", string.Empty, "$.steps[7].tempco", "give nominalBiasAmps" },
        { "{ \"kind\": \"iv-sweep\", \"name\": \"iv-low\", \"setpoint\": \"cal-low\"", "{ \"kind\": \"iv-sweep\", \"name\": \"iv-low\", \"setpoint\": \"cal-high\"", "$.steps[3].setpoint", "settled at 'cal-low' here, not at 'cal-high'" },
    };

    [Theory]
    [MemberData(nameof(BadSweeps))]
    public void Check_BadSweep_ReportsPathAndReason(string find, string replace, string path, string reason)
    {
        var result = Load(TestFiles.Edit(File.ReadAllText(TestFiles.ShippedSequencePath), find, replace), Fixture());

        Assert.False(result.IsSuccess);
        Assert.Contains(result.Problems, p => p.JsonPath == path && p.Reason.Contains(reason, StringComparison.Ordinal));
    }

    [Fact]
    public void Check_TemperatureCoefficientWithoutAnEarlierSweep_IsRefused()
    {
        // Remove the first sweep: the second has no sweep at another setpoint to compare with.
        var text = File.ReadAllText(TestFiles.ShippedSequencePath);
        var start = text.IndexOf("    { \"kind\": \"iv-sweep\", \"name\": \"iv-low\"", StringComparison.Ordinal);
        var end = text.IndexOf("    { \"kind\": \"measure\", \"name\": \"cal-low\"", StringComparison.Ordinal);
        var result = Load(text.Remove(start, end - start), Fixture());

        Assert.Contains(result.Problems, p => p.JsonPath == "$.steps[6].tempco" && p.Reason.Contains("earlier iv-sweep step at another setpoint", StringComparison.Ordinal));
    }

    [Fact]
    public void Check_FixtureWithoutSourceMeter_IsRefused()
    {
        var fixture = Fixture() with { SourceMeter = null, Slots = Fixture().Slots.Select(s => s with { SmuChannel = null }).ToList() };

        var result = Load(File.ReadAllText(TestFiles.ShippedSequencePath), fixture);

        Assert.Contains(result.Problems, p => p.JsonPath == "$.steps[3]" && p.Reason.Contains("has no source-measure unit", StringComparison.Ordinal));
    }

    [Fact]
    public void SweepCurrents_LogRange_SpacesEvenlyInLogWithExactEnds()
    {
        var step = new IvSweepStep { Setpoint = "x", FromAmps = 1e-6, ToAmps = 1e-3, Points = 4 };

        // 1 µA to 1 mA in 4 points: one decade apart.
        Assert.Equal([1e-6, 1e-5, 1e-4, 1e-3], step.SweepCurrents().ToArray(), (a, b) => Math.Abs(a - b) <= 1e-15);
    }

    private static FixtureDefinition Fixture() => FixtureLoader.LoadFile(TestFiles.ShippedFixturePath).Value!;

    private static LineTest.Core.Definitions.LoadResult<SequenceDefinition> Load(string text, FixtureDefinition fixture) =>
        SequenceLoader.Load("edited.json", Encoding.UTF8.GetBytes(text), fixture);
}
