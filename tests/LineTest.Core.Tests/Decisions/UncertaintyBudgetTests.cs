using LineTest.Core.Decisions;

namespace LineTest.Core.Tests.Decisions;

public sealed class UncertaintyBudgetTests
{
    private static UncertaintyBudget Example() => new(
    [
        UncertaintyComponent.FromSamples("repeatability", [20.1, 20.3, 20.2, 20.4, 20.0]),
        UncertaintyComponent.FromRectangular("meter spec", 0.1),
        UncertaintyComponent.FromResolution("display", 0.01),
        UncertaintyComponent.FromExpanded("reference certificate", 0.02, 2),
        UncertaintyComponent.FromStandard("meter voltage", 0.0001, UncertaintyType.B, sensitivity: 100),
    ]);

    [Fact]
    public void CombinedStandardUncertainty_FiveInputs_IsRootSumOfSquares()
    {
        // JCGM 100:2008 §5.1.2 eq. (10), uncorrelated inputs: u_c² = Σ cᵢ²u²(xᵢ).
        // Hand-worked: 0.005 + 0.01/3 + 0.0001/12 + 0.0001 + 0.0001 = 0.00854167 → u_c = 0.0924211.
        Assert.Equal(0.0924211376, Example().CombinedStandardUncertainty, 9);
    }

    [Fact]
    public void Expand_DefaultK_IsTwiceTheCombined()
    {
        // JCGM 100:2008 §6.2.1, §6.3.3: U = k·u_c with k = 2 → 0.184842.
        var expanded = Example().Expand();

        Assert.Equal(2.0, expanded.CoverageFactor);
        Assert.Equal(0.1848422751, expanded.Expanded, 9);
    }

    [Fact]
    public void Expand_GivenK_UsesIt()
    {
        Assert.Equal(3 * 0.0924211376, Example().Expand(3).Expanded, 9);
    }

    [Fact]
    public void EffectiveDegreesOfFreedom_OneTypeAInput_FollowsWelchSatterthwaite()
    {
        // JCGM 100:2008 G.4.1 [from memory]: ν_eff = u_c⁴ / Σ uᵢ⁴/νᵢ, Type B inputs with ν = ∞.
        // Hand-worked: 0.00854167² / (0.005²/4) = 7.29601e-5 / 6.25e-6 = 11.6736.
        Assert.Equal(11.6736111, Example().EffectiveDegreesOfFreedom!.Value, 6);
    }

    [Fact]
    public void EffectiveDegreesOfFreedom_OnlyTypeB_IsInfinite()
    {
        var budget = new UncertaintyBudget([UncertaintyComponent.FromRectangular("meter spec", 0.1)]);

        Assert.Null(budget.EffectiveDegreesOfFreedom);
    }

    [Fact]
    public void CombinedStandardUncertainty_Empty_IsZero()
    {
        Assert.Equal(0.0, new UncertaintyBudget([]).CombinedStandardUncertainty);
    }
}
