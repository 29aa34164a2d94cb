namespace LineTest.Core.Decisions;

/// <summary>
/// An uncertainty budget for uncorrelated inputs: u_c² = Σ cᵢ²·u²(xᵢ) (JCGM 100:2008 §5.1.2, eq. 10).
/// </summary>
public sealed class UncertaintyBudget
{
    /// <summary>Coverage factor used when none is given: k = 2, about 95 % for a normal distribution (§6.3.3).</summary>
    public const double DefaultCoverageFactor = 2.0;

    /// <summary>Creates a budget from its components.</summary>
    public UncertaintyBudget(IEnumerable<UncertaintyComponent> components)
    {
        ArgumentNullException.ThrowIfNull(components);
        Components = components.ToArray();
        foreach (var component in Components)
        {
            ArgumentNullException.ThrowIfNull(component, nameof(components));
        }
    }

    /// <summary>The inputs, in the order given.</summary>
    public IReadOnlyList<UncertaintyComponent> Components { get; }

    /// <summary>u_c = √(Σ (cᵢ·u(xᵢ))²).</summary>
    public double CombinedStandardUncertainty => Math.Sqrt(Components.Sum(c => c.Contribution * c.Contribution));

    /// <summary>
    /// Welch–Satterthwaite effective degrees of freedom ν_eff = u_c⁴ / Σ (cᵢ·uᵢ)⁴/νᵢ (JCGM 100:2008 G.4.1);
    /// inputs with infinite νᵢ add nothing to the sum. Null (infinite) when no input has finite νᵢ.
    /// </summary>
    public double? EffectiveDegreesOfFreedom
    {
        get
        {
            var denominator = 0.0;
            foreach (var c in Components)
            {
                if (c.DegreesOfFreedom is { } nu && c.Contribution > 0.0)
                {
                    denominator += Math.Pow(c.Contribution, 4) / nu;
                }
            }

            return denominator > 0.0 ? Math.Pow(CombinedStandardUncertainty, 4) / denominator : null;
        }
    }

    /// <summary>The expanded uncertainty U = k·u_c.</summary>
    public ExpandedUncertainty Expand(double coverageFactor = DefaultCoverageFactor)
    {
        if (!(double.IsFinite(coverageFactor) && coverageFactor > 0.0))
        {
            throw new ArgumentOutOfRangeException(nameof(coverageFactor), coverageFactor, "Coverage factor must be positive.");
        }

        return new ExpandedUncertainty(CombinedStandardUncertainty, coverageFactor)
        {
            EffectiveDegreesOfFreedom = EffectiveDegreesOfFreedom,
        };
    }
}
