using System.Text.Json;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class ResistorTrimSpecTests
{
    private static readonly JsonSerializerOptions Web = new(JsonSerializerDefaults.Web);

    [Fact]
    public void Deserialize_DocumentedJson_ReadsEveryFieldAndChecksClean()
    {
        const string json = """
            {
              "series": "E96", "allowPairs": true, "tolerancePercent": 1,
              "gain": { "position": "R7", "feedbackOhms": 40200, "fittedOhms": 10000, "minOhms": 1000, "maxOhms": 100000 },
              "offset": { "position": "R8", "referenceVolts": 2.5, "feedbackOhms": 10000, "fittedOhms": 100000,
                          "minOhms": 10000, "maxOhms": 1000000 },
              "target": { "offsetVolts": 0.5, "slopeVoltsPerC": 0.01 }
            }
            """;

        var spec = JsonSerializer.Deserialize<ResistorTrimSpec>(json, Web)!;

        Assert.Equal("E96", spec.Series);
        Assert.True(spec.AllowPairs);
        Assert.Equal(40200, spec.Gain.FeedbackOhms);
        Assert.Equal("R8", spec.Offset.Position);
        Assert.Equal(2.5, spec.Offset.ReferenceVolts);
        Assert.Equal(0.01, spec.Target.SlopeVoltsPerC);
        Assert.Empty(spec.Check());
    }

    [Fact]
    public void Check_BadFields_ListsEachWithItsPath()
    {
        var spec = new ResistorTrimSpec
        {
            Series = "E96",
            TolerancePercent = -1,
            Gain = new ResistorGainNetwork { Position = "", FeedbackOhms = 0, MinOhms = 10, MaxOhms = 5 },
            Offset = new ResistorOffsetNetwork { Position = "R8", ReferenceVolts = 0, FeedbackOhms = 1, MinOhms = 1, MaxOhms = 2 },
            Target = new LinearTransfer { OffsetVolts = 0.5, SlopeVoltsPerC = 0.01 },
        };

        var problems = spec.Check();

        Assert.Contains(problems, p => p.Path == "tolerancePercent");
        Assert.Contains(problems, p => p.Path == "gain.position");
        Assert.Contains(problems, p => p.Path == "gain.maxOhms");
        Assert.Contains(problems, p => p.Path == "gain.feedbackOhms");
        Assert.Contains(problems, p => p.Path == "offset.referenceVolts");
    }
}
