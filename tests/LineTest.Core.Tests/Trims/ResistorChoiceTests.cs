using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class ResistorChoiceTests
{
    [Theory]
    [InlineData(ResistorConnection.Series, 10_000.0, 2_200.0, 12_200.0)]      // R1 + R2
    [InlineData(ResistorConnection.Parallel, 10_000.0, 10_000.0, 5_000.0)]    // R1·R2/(R1 + R2)
    [InlineData(ResistorConnection.Parallel, 43_000.0, 12_000.0, 9_381.818181818182)]
    public void Combine_Pair_FollowsTheCircuitLaw(ResistorConnection connection, double r1, double r2, double expected)
    {
        Assert.Equal(expected, ResistorChoice.Combine(connection, [r1, r2]), 9);
    }

    [Fact]
    public void Instruction_SeriesPair_NamesBothPartsAndThePosition()
    {
        var choice = new ResistorChoice
        {
            Position = "R7",
            IdealOhms = 12_150,
            Connection = ResistorConnection.Series,
            Parts = [10_000, 2_150],
            Series = ESeries.E96,
        };

        Assert.Equal("Fit 10 kΩ and 2.15 kΩ (E96) in series in position R7", choice.Instruction);
        Assert.Equal(0.0, choice.RelativeError, 12);
    }
}
