namespace LineTest.Core.Statistics;

/// <summary>
/// Capability from percentiles rather than from a normal σ, for data that are not normal
/// (ISO 22514-2 percentile method [from memory]): the 0.135 %, 50 % and 99.865 % points of the data take the place
/// of μ − 3σ, μ and μ + 3σ.
/// </summary>
/// <param name="Count">Number of values.</param>
/// <param name="Lower">The 0.135 % point X₀.₀₀₁₃₅.</param>
/// <param name="Median">The 50 % point X₀.₅.</param>
/// <param name="Upper">The 99.865 % point X₀.₉₉₈₆₅.</param>
/// <param name="Pp">(USL − LSL)/(X₀.₉₉₈₆₅ − X₀.₀₀₁₃₅); null unless both limits are given.</param>
/// <param name="Ppu">(USL − X₀.₅)/(X₀.₉₉₈₆₅ − X₀.₅); null without an upper limit.</param>
/// <param name="Ppl">(X₀.₅ − LSL)/(X₀.₅ − X₀.₀₀₁₃₅); null without a lower limit.</param>
/// <param name="Ppk">min(Ppu, Ppl) over the limits that exist.</param>
/// <param name="ExtremesInterpolated">
/// True when n &lt; 1/0.00135 ≈ 741: the 0.135 % and 99.865 % points then lie between the two most extreme values, so
/// the spread is underestimated and the indices read optimistic.
/// </param>
public sealed record PercentileCapabilityResult(
    int Count,
    double Lower,
    double Median,
    double Upper,
    double? Pp,
    double? Ppu,
    double? Ppl,
    double? Ppk,
    bool ExtremesInterpolated);
