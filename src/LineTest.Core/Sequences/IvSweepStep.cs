using System.Text.Json.Serialization;
using LineTest.Core.Decisions;

namespace LineTest.Core.Sequences;

/// <summary>
/// Sensor characterisation at a stable setpoint: forces a series of forward currents through each unit's sensing
/// diode with the fixture's source-measure unit, fits the Shockley equation <c>V = n·V_T·ln(I/I_s + 1) + I·R_s</c>
/// (see <c>Characterisation.ShockleyFit</c>) and judges n, log10 I_s, R_s and the largest residual against limits.
/// A second sweep at another setpoint also gives the forward-voltage temperature coefficient at the nominal bias
/// current and V_f extrapolated to 0 K. Currents come from <see cref="CurrentsAmps"/> or from a logarithmic range
/// (<see cref="FromAmps"/>, <see cref="ToAmps"/>, <see cref="Points"/>).
/// </summary>
public sealed record IvSweepStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "iv-sweep";

    /// <summary>The setpoint the source must be settled at.</summary>
    public required string Setpoint { get; init; }

    /// <summary>The sweep currents, amperes, increasing; or null to use the logarithmic range.</summary>
    public IReadOnlyList<double>? CurrentsAmps { get; init; }

    /// <summary>First current of a logarithmic range, amperes.</summary>
    public double? FromAmps { get; init; }

    /// <summary>Last current of a logarithmic range, amperes.</summary>
    public double? ToAmps { get; init; }

    /// <summary>Number of currents of a logarithmic range, evenly spaced in log.</summary>
    public int? Points { get; init; }

    /// <summary>Voltage compliance of the source-measure unit, volts; the fixture's when omitted.</summary>
    public double? ComplianceVolts { get; init; }

    /// <summary>Voltage readings averaged at each current.</summary>
    public int Samples { get; init; } = 1;

    /// <summary>
    /// Bias current at which the forward-voltage temperature coefficient is reported, amperes; the sequence's
    /// <see cref="SequenceDefinition.NominalBiasAmps"/> when omitted.
    /// </summary>
    public double? NominalBiasAmps { get; init; }

    /// <summary>Limits on the ideality factor n (unit 1).</summary>
    [JsonPropertyName("n")]
    public LimitSpec? IdealityLimits { get; init; }

    /// <summary>Limits on log10 of the saturation current in amperes at the sweep temperature (unit 1).</summary>
    [JsonPropertyName("log10Is")]
    public LimitSpec? Log10SaturationCurrentLimits { get; init; }

    /// <summary>Limits on the series resistance (unit ohm or kohm).</summary>
    [JsonPropertyName("rsOhms")]
    public LimitSpec? SeriesResistanceLimits { get; init; }

    /// <summary>Limits on the largest |residual| of the fit (unit mV, uV or V).</summary>
    [JsonPropertyName("maxResidualMillivolts")]
    public LimitSpec? MaxResidualLimits { get; init; }

    /// <summary>Limits on dV_f/dT at the nominal bias against an earlier sweep at another setpoint (unit mV/degC).</summary>
    [JsonPropertyName("tempco")]
    public LimitSpec? TemperatureCoefficientLimits { get; init; }

    /// <summary>Limits on V_f extrapolated to 0 K along the two-sweep chord (unit V or mV).</summary>
    [JsonPropertyName("zeroKelvinVolts")]
    public LimitSpec? ZeroKelvinLimits { get; init; }

    /// <summary>
    /// The sweep currents, amperes: <see cref="CurrentsAmps"/> when given, otherwise <see cref="Points"/> currents from
    /// <see cref="FromAmps"/> to <see cref="ToAmps"/> evenly spaced in log; empty when neither is complete.
    /// </summary>
    public IReadOnlyList<double> SweepCurrents()
    {
        if (CurrentsAmps is { } list)
        {
            return list;
        }

        // Never more than the bound: a points count out of it is reported by the checker and must not allocate here.
        if (FromAmps is not { } from || ToAmps is not { } to || Points is not { } points || points < 2 || points > Steps.IvSweepStepKind.MaxPoints
            || !(from > 0) || !(to > 0))
        {
            return [];
        }

        var currents = new double[points];
        for (var i = 0; i < points; i++)
        {
            currents[i] = from * Math.Pow(to / from, i / (double)(points - 1));
        }

        // Exact ends, whatever the rounding of the powers.
        currents[^1] = to;
        return currents;
    }
}
