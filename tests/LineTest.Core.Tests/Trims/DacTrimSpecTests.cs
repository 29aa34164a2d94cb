using System.Text.Json;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class DacTrimSpecTests
{
    [Fact]
    public void Deserialize_CamelCaseJson_ReadsEveryFieldAndChecksClean()
    {
        const string json = """
            { "gain": { "min": 0, "max": 4095, "nominal": 2048, "step": 0.0001, "register": "GAIN" },
              "offset": { "min": 0, "max": 4095, "nominal": 2048, "step": 0.00025, "register": "OFFS" },
              "target": { "offsetVolts": 0.1, "slopeVoltsPerC": 0.01 } }
            """;

        var spec = JsonSerializer.Deserialize<DacTrimSpec>(json, new JsonSerializerOptions(JsonSerializerDefaults.Web))!;

        Assert.Equal(0.0001, spec.Gain.Step);
        Assert.Equal("OFFS", spec.Offset.Register);
        Assert.Empty(spec.Check());
    }

    [Fact]
    public void Check_MinAboveMaxAndNoRegister_ListsBothWithPaths()
    {
        var spec = new DacTrimSpec
        {
            Gain = new DacChannelSpec { Min = 10, Max = 0, Nominal = 5, Step = 0.001, Register = "GAIN" },
            Offset = new DacChannelSpec { Min = 0, Max = 10, Nominal = 5, Step = 0.001, Register = " " },
            Target = new LinearTransfer { OffsetVolts = 0.5, SlopeVoltsPerC = 0 },
        };

        var problems = spec.Check();

        Assert.Equal(
            [new SpecProblem("gain.min", "min (10) must be below max (0)"),
             new SpecProblem("offset.register", "' ' is not a register name the unit link can carry (an upper-case letter, then A–Z, 0–9 or _), e.g. GAIN"),
             new SpecProblem("target.slopeVoltsPerC", "must be a finite number other than 0")],
            problems);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(21)]
    public void Check_CheckPairsOutsideItsBound_NamesTheKey(int pairs)
    {
        var spec = new DacTrimSpec
        {
            Gain = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "GAIN" },
            Offset = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "OFFS" },
            Target = new LinearTransfer { OffsetVolts = 0.5, SlopeVoltsPerC = 0.01 },
            CheckPairs = pairs,
        };

        var problem = Assert.Single(spec.Check());

        Assert.Equal("checkPairs", problem.Path);
    }
}
