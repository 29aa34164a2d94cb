namespace LineTest.Core.Trims;

/// <summary>
/// Sequence parameters of a firmware-coefficient trim.
/// </summary>
/// <remarks>
/// <para>Unit model: the digital unit reports T = c0 + c1·r (+ c2·r²) °C, where r is its raw ADC reading
/// (counts, before any correction) and cᵢ = qᵢ·LSBᵢ are the coefficients held in signed fixed-point
/// registers (see <see cref="FirmwareCoefficientSpec"/>). Calibration reads r at each setpoint; the fit
/// gives ideal cᵢ, which are rounded half away from zero to register values qᵢ.</para>
/// <para>JSON: <c>{ "order": 1, "coefficients": [ { "register": "C0", "bits": 16, "fractionalBits": 8 },
/// { "register": "C1", "bits": 32, "fractionalBits": 24 } ] }</c></para>
/// </remarks>
public sealed record FirmwareTrimSpec
{
    /// <summary>1 for a straight line, 2 for a quadratic.</summary>
    public required int Order { get; init; }

    /// <summary>One register per coefficient, c0 first; Order + 1 entries.</summary>
    public required IReadOnlyList<FirmwareCoefficientSpec> Coefficients { get; init; }

    /// <summary>Problems that make the spec unusable, each with its path relative to the spec; empty when the spec is sound.</summary>
    public IReadOnlyList<SpecProblem> Check()
    {
        var problems = new List<SpecProblem>();
        if (Order is not (1 or 2))
        {
            problems.Add(new("order", $"{Order} is not 1 (line) or 2 (quadratic)"));
        }

        if (Coefficients is null)
        {
            problems.Add(new("coefficients", "missing"));
            return problems;
        }

        if (Order is 1 or 2 && Coefficients.Count != Order + 1)
        {
            problems.Add(new("coefficients", $"order {Order} needs {Order + 1} registers, got {Coefficients.Count}"));
        }

        var seen = new HashSet<string>(StringComparer.Ordinal);
        for (var i = 0; i < Coefficients.Count; i++)
        {
            if (Coefficients[i] is not { } coefficient)
            {
                problems.Add(new($"coefficients[{i}]", "missing"));
                continue;
            }

            problems.AddRange(coefficient.Check().Select(p => p.Under($"coefficients[{i}]")));
            if (coefficient.Register is { } register && !seen.Add(register))
            {
                problems.Add(new($"coefficients[{i}].register", $"register '{register}' is used more than once"));
            }
        }

        return problems;
    }
}
