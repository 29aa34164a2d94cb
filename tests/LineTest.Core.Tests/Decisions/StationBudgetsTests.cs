using LineTest.Core.Decisions;
using LineTest.Core.Stability;

namespace LineTest.Core.Tests.Decisions;

public sealed class StationBudgetsTests
{
    [Fact]
    public void Predicted_AddsTheExtrapolationAsItsOwnLine_AndTheGuardBandWidens()
    {
        // [published] JCGM 100:2008 §5.1.2: uncorrelated inputs add in quadrature, so a reference budget of
        // u = 0.010 °C with an extrapolation of u(y∞) = 0.006 °C (ν = n − 3 = 27, §H.3) has u_c = √(0.010² + 0.006²);
        // ILAC G8:09/2019 §4.2 guarded acceptance then moves each acceptance limit in by U = 2·u_c.
        var reference = new UncertaintyBudget([UncertaintyComponent.FromStandard("reference certificate", 0.010, UncertaintyType.B)]);
        var fit = new ExponentialApproachResult(true, 40.0, 0.006, -2, 40, 1, 0.004, 30, 0, false, "converged");

        var predicted = StationBudgets.Predicted(reference, StationBudgets.Extrapolation(fit));

        Assert.Equal(2, predicted.Components.Count);
        var line = predicted.Components.Single(c => c.Name == StationBudgets.ExtrapolationComponent);
        Assert.Equal(UncertaintyType.A, line.Type);
        Assert.Equal(27, line.DegreesOfFreedom);
        Assert.Equal(Math.Sqrt((0.010 * 0.010) + (0.006 * 0.006)), predicted.CombinedStandardUncertainty, 12);
        Assert.True(predicted.Expand().Expanded > reference.Expand().Expanded);
    }

    // Found in review: a unit's follower fit has four parameters (y∞, the leader's amplitude, its own amplitude and τ),
    // but its extrapolation line was given ν = n − 3 like the reference's three-parameter fit.
    [Fact]
    public void Extrapolation_FollowerFit_DegreesOfFreedomAreReadingsLessFour()
    {
        // [published] JCGM 100:2008 §H.3: a least-squares fit of p parameters to n readings leaves ν = n − p.
        var follower = new ExponentialApproachResult(true, 0.3, 0.004, 0.1, 45, 2, 0.003, 30, 0, false, "converged") { LeaderTimeConstantSeconds = 40, LeaderAmplitude = -0.2 };

        Assert.Equal(26, StationBudgets.Extrapolation(follower).DegreesOfFreedom);
    }

    [Fact]
    public void Extrapolation_ThroughASensitivity_ScalesTheContribution()
    {
        // [published] JCGM 100:2008 §5.1.3: the contribution is |cᵢ|·u(xᵢ); a unit's u(y∞) of 0.004 °C read as volts at
        // 10 mV/°C contributes 40 µV.
        var fit = new ExponentialApproachResult(true, 0.3, 0.004, 0.1, 45, 2, 0.003, 60, 0, false, "converged");

        Assert.Equal(40e-6, StationBudgets.Extrapolation(fit, 0.01).Contribution, 15);
    }

    [Fact]
    public void Extrapolation_FitThatDidNotConverge_IsRefused()
    {
        var fit = new ExponentialApproachResult(false, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, 3, 0, false, "only 3 readings");

        Assert.Throws<ArgumentException>(() => StationBudgets.Extrapolation(fit));
    }
}
