using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Sequences;

public sealed class SettleSettingsTests
{
    [Fact]
    public void ForAll_Predictive_ReplacesTheSequencesAndEverySetpointsOwnSettings()
    {
        var sequence = Shipped() is var s
            ? s with
            {
                Settle = new SettleSettings(),
                Setpoints = [s.Setpoints[0] with { Settle = new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.02 } }, .. s.Setpoints.Skip(1)],
            }
            : throw new InvalidOperationException();
        var predictive = new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.01 };

        var forced = SettleSettings.ForAll(sequence, predictive);
        var window = SettleSettings.ForAll(sequence, null);

        Assert.All(forced.Setpoints, p => Assert.Equal(predictive, SettleSettings.For(forced, p.Name)));
        Assert.All(window.Setpoints, p => Assert.Equal(SettleModes.Window, SettleSettings.For(window, p.Name).Mode));
        Assert.Equal(0.02, SettleSettings.For(sequence, sequence.Setpoints[0].Name).MaxExtrapolationUncertaintyC);
        Assert.Equal(SettleModes.Window, SettleSettings.For(sequence, sequence.Setpoints[1].Name).Mode);
    }

    private static SequenceDefinition Shipped()
    {
        var fixture = FixtureLoader.Load(TestFiles.ShippedFixturePath, File.ReadAllBytes(TestFiles.ShippedFixturePath)).Value!;
        return SequenceLoader.Load(TestFiles.ShippedSequencePath, File.ReadAllBytes(TestFiles.ShippedSequencePath), fixture).Value!;
    }
}
