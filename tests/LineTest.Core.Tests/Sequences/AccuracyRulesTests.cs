using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Sequences;

public sealed class AccuracyRulesTests
{
    private static string Shipped(string file) => File.ReadAllText(Path.Combine(AppContext.BaseDirectory, "Shipped", "sequences", file));

    public static TheoryData<string, string, string, string, string> BadAccuracyFields => new()
    {
        { "ctp40a-dac.json", "\"fit\": \"minimax\"", "\"fit\": \"best\"", "$.trim.fit", "'best' is not a fit objective" },
        { "ctp40a-dac.json", "\"ratedRange\": { \"lowC\": -20, \"highC\": 40 },", string.Empty, "$.trim.fit", "'minimax' needs the sequence's 'ratedRange'" },
        { "ctp40a-dac.json", "\"highC\": 40 }", "\"highC\": -40 }", "$.ratedRange", "highC above lowC" },
        { "ctp40a-dac.json", "\"xtiStdDev\": 0.1", "\"xtiStdDev\": -0.1", "$.trim.sensorModel.xtiStdDev", "must be zero or a positive number" },
        { "ctp40a-dac.json", "\"forwardVolts\": 0.600", "\"forwardVolts\": 1.3", "$.trim.sensorModel.forwardVolts", "at or above the band gap" },
        { "ctp40d-firmware.json", "\"ratedRange\": { \"lowC\": -20, \"highC\": 40 },", string.Empty, "$.trim.sensorModel", "give the sequence a 'ratedRange'" },
        { "ctp40d-firmware.json", "\"method\": \"firmware\",", "\"method\": \"firmware\", \"fit\": \"minimax\",", "$.trim.fit", "'minimax' is for gain-and-offset trims" },
        {
            "ctp40a-dac.json", "\"ratedRange\": { \"lowC\": -20, \"highC\": 40 }",
            "\"ratedRange\": { \"lowC\": -20, \"highC\": 40, \"maxAbsErrorLimits\": { \"high\": 0.3, \"unit\": \"V\" } }",
            "$.ratedRange.maxAbsErrorLimits.unit", "the unit must be degC"
        },
    };

    [Theory]
    [MemberData(nameof(BadAccuracyFields))]
    public void Load_BadAccuracyField_ReportsPathAndReason(string file, string find, string replace, string path, string reason)
    {
        var text = TestFiles.Edit(Shipped(file), find, replace);

        var result = SequenceLoader.Load(file, TestFiles.Utf8(text), null);

        Assert.False(result.IsSuccess);
        Assert.Contains(result.Problems, p => p.JsonPath == path && p.Reason.Contains(reason, StringComparison.Ordinal));
    }

    [Fact]
    public void Load_ShippedDacSequence_ReadsRatedRangeFitAndSensorModel()
    {
        var result = SequenceLoader.Load("ctp40a-dac.json", TestFiles.Utf8(Shipped("ctp40a-dac.json")), null);

        Assert.True(result.IsSuccess, string.Join(Environment.NewLine, result.Problems));
        Assert.Equal((-20.0, 40.0), (result.Value.RatedRange!.LowC, result.Value.RatedRange.HighC));
        Assert.Equal(TrimFits.Minimax, result.Value.Trim!.Fit);
        Assert.Equal((3.0, 0.1, 40.0), (result.Value.Trim.SensorModel!.Xti, result.Value.Trim.SensorModel.XtiStdDev, result.Value.Trim.SensorModel.ThermalTimeConstantSeconds!.Value));
    }
}
