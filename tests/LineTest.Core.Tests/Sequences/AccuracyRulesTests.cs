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

    private static SequenceDefinition ShippedSequence(string file)
    {
        var result = SequenceLoader.Load(file, TestFiles.Utf8(Shipped(file)), null);
        Assert.True(result.IsSuccess, string.Join(Environment.NewLine, result.Problems));
        return result.Value;
    }

    [Theory]
    [InlineData("ctp40a-dac-3pt.json")]
    [InlineData("ctp40r-resistor-3pt.json")]
    public void Load_ShippedThreePointSequence_IsAcceptedAndFitsTheUnitsCurvature(string file)
    {
        var sequence = ShippedSequence(file);
        var trim = sequence.Steps.OfType<TrimStep>().Single();

        Assert.Equal(3, trim.Points.Count);
        Assert.True(Core.Calibration.TrimAccuracy.FitsUnitCurvature(sequence, trim.Points.Count));
    }

    public static TheoryData<string, string, string, string> BadThreePointEdits => new()
    {
        { "\"points\": [ \"cal-low\", \"verify\", \"cal-high\" ]", "\"points\": [ \"cal-low\", \"verify\", \"cal-high\", \"cal-low\" ]", ".points", "a dac trim takes two calibration points, or three" },
        { "{ \"name\": \"verify\", \"celsius\": 5 }", "{ \"name\": \"verify\", \"celsius\": -20 }", ".points[1]", "at the same temperature as 'cal-low' (-20 degC)" },
        { "{ \"name\": \"verify\", \"celsius\": 5 }", "{ \"name\": \"verify\", \"celsius\": 35 }", ".points[1]", "is 91.7 % of the way from 'cal-low' to 'cal-high': put it between 20 % and 80 %" },
        { "\"ratedRange\": { \"lowC\": -20, \"highC\": 40 }", "\"ratedRange\": { \"lowC\": 10, \"highC\": 40 }", ".points[1]", "the inner calibration point 'verify' (5 degC) is outside the rated range 10 … 40 degC" },
    };

    [Theory]
    [MemberData(nameof(BadThreePointEdits))]
    public void Load_BadThirdCalibrationPoint_ReportsPathAndReason(string find, string replace, string pathEnd, string reason)
    {
        var text = TestFiles.Edit(Shipped("ctp40a-dac-3pt.json"), find, replace);

        var result = SequenceLoader.Load("ctp40a-dac-3pt.json", TestFiles.Utf8(text), null);

        Assert.False(result.IsSuccess);
        var trimPath = $"$.steps[{ShippedSequence("ctp40a-dac-3pt.json").Steps.ToList().FindIndex(s => s is TrimStep)}]";
        Assert.Contains(result.Problems, p => p.JsonPath == trimPath + pathEnd && p.Reason.Contains(reason, StringComparison.Ordinal));
    }

    [Fact]
    public void Check_ThirdPointWithoutSensorModel_SaysTheShapeIsNeeded()
    {
        var shipped = ShippedSequence("ctp40r-resistor-3pt.json");
        var sequence = shipped with { Trim = shipped.Trim! with { Fit = TrimFits.ThroughPoints, SensorModel = null } };

        var problems = SequenceChecker.Check(sequence, null);

        Assert.Contains(problems.Items, p => p.Path.EndsWith(".points", StringComparison.Ordinal) && p.Reason.Contains("needs the trim's 'sensorModel'", StringComparison.Ordinal));
    }

    [Fact]
    public void Check_TwoPointsAnywhere_NoThreePointRules()
    {
        // The two-point demo sequences keep passing: the rules apply only to a third point.
        Assert.Empty(SequenceChecker.Check(ShippedSequence("ctp40a-dac.json"), null).Items);
    }
}
