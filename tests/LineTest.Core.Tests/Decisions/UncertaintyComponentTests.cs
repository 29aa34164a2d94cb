using LineTest.Core.Decisions;

namespace LineTest.Core.Tests.Decisions;

public sealed class UncertaintyComponentTests
{
    [Fact]
    public void FromSamples_FiveReadings_IsStandardDeviationOfTheMean()
    {
        // JCGM 100:2008 §4.2.2–4.2.3: s² = Σ(x − x̄)²/(n − 1), u = s/√n.
        // Hand-worked: 20.1, 20.3, 20.2, 20.4, 20.0 → x̄ = 20.2; Σ(x − x̄)² = 0.01 + 0.01 + 0 + 0.04 + 0.04 = 0.1;
        // s² = 0.025; u = √(0.025/5) = √0.005 = 0.0707107; ν = 4.
        var u = UncertaintyComponent.FromSamples("repeatability", [20.1, 20.3, 20.2, 20.4, 20.0]);

        Assert.Equal(Math.Sqrt(0.005), u.StandardUncertainty, 12);
        Assert.Equal(UncertaintyType.A, u.Type);
        Assert.Equal(4.0, u.DegreesOfFreedom);
    }

    [Fact]
    public void FromRectangular_HalfWidth_IsDividedByRootThree()
    {
        // JCGM 100:2008 §4.3.7: u = a/√3. Hand-worked: a = 0.1 → 0.0577350.
        var u = UncertaintyComponent.FromRectangular("meter spec", 0.1);

        Assert.Equal(0.0577350269, u.StandardUncertainty, 9);
        Assert.Equal(UncertaintyType.B, u.Type);
        Assert.Null(u.DegreesOfFreedom);
    }

    [Fact]
    public void FromResolution_Digit_IsDividedByTwoRootThree()
    {
        // JCGM 100:2008 §F.2.2.1: u = δ/(2√3). Hand-worked: δ = 0.01 → 0.00288675.
        var u = UncertaintyComponent.FromResolution("display", 0.01);

        Assert.Equal(0.00288675135, u.StandardUncertainty, 10);
    }

    [Fact]
    public void FromExpanded_Certificate_IsDividedByK()
    {
        // JCGM 100:2008 §4.3.3: u = U/k. Hand-worked: U = 0.02 °C at k = 2 → 0.01 °C.
        var u = UncertaintyComponent.FromExpanded("reference certificate", 0.02, 2);

        Assert.Equal(0.01, u.StandardUncertainty, 12);
    }

    [Fact]
    public void Contribution_UsesTheMagnitudeOfTheSensitivity()
    {
        // JCGM 100:2008 §5.1.3: contribution |cᵢ|·u(xᵢ). Hand-worked: u = 0.1 mV, c = −100 °C/V → 0.01 °C.
        var u = UncertaintyComponent.FromStandard("meter", 0.0001, UncertaintyType.B, sensitivity: -100);

        Assert.Equal(0.01, u.Contribution, 12);
    }

    [Fact]
    public void FromSamples_OneSample_ThrowsNamingTheInput()
    {
        var ex = Assert.Throws<ArgumentException>(() => UncertaintyComponent.FromSamples("repeatability", [1.0]));

        Assert.Contains("repeatability", ex.Message);
    }

    [Fact]
    public void FromRectangular_NegativeHalfWidth_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => UncertaintyComponent.FromRectangular("meter", -0.1));
    }
}
