using LineTest.Core.Units;
using LineTest.Station.Screen;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Screen;

public sealed class StepWordsTests
{
    private static readonly StepWords Words = new(Station.Composition.DefinitionFiles.ReadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture: null).Value!);

    [Theory]
    [InlineData(UnitState.Verifying, "verify.error", null, "checking at 5 °C")]
    [InlineData(UnitState.Measuring, "cal-low", null, "reading at -20 °C")]
    [InlineData(UnitState.Measuring, "iv-high", null, "I-V sweep at 40 °C")]
    [InlineData(UnitState.WaitingForSource, "settle", 40.0, "block to 40 °C")]
    [InlineData(UnitState.Soaking, "settle", -20.0, "soaking at -20 °C")]
    [InlineData(UnitState.CheckingSupply, "supply.current", null, "supply current")]
    [InlineData(UnitState.Trimming, "trim", null, "trimming")]
    public void Of_StepOfTheDemoSequence_PlainWordsThatFitTheColumn(UnitState state, string step, double? setpointC, string expected)
    {
        // What broke: "verifying verify.error" read like an error.
        var words = Words.Of(state, step, setpointC);

        Assert.Equal(expected, words);
        Assert.True(words.Length <= StepWords.Width);
    }
}
