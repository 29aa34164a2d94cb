namespace LineTest.Core.Thermometry;

/// <summary>
/// A thermocouple of type K or T read as an emf in mV, with cold-junction compensation: the measured emf is
/// E(t) − E(t_cj), so t = E⁻¹(E_measured + E(t_cj)), where E is the NIST ITS-90 reference function
/// (NIST Monograph 175) with its reference junction at 0 °C.
/// </summary>
public sealed class Thermocouple : IReferenceSensor
{
    private readonly ThermocoupleReferenceFunction _function;
    private readonly double _coldJunctionEmfMillivolts;

    /// <summary>
    /// A thermocouple with its cold junction at <paramref name="coldJunctionC"/>; throws when that lies outside
    /// the type's range (use <see cref="Validate"/> first for a message list).
    /// </summary>
    public Thermocouple(ThermocoupleType type, double coldJunctionC = 0.0)
    {
        var errors = Validate(type, coldJunctionC);
        if (errors.Count > 0)
        {
            throw new ArgumentException(string.Join("; ", errors));
        }

        _function = ThermocoupleReferenceFunction.For(type);
        Type = type;
        ColdJunctionC = coldJunctionC;
        _coldJunctionEmfMillivolts = _function.EmfUnchecked(coldJunctionC);
        Name = $"type {type} thermocouple (NIST ITS-90, cold junction {RangeText.Number(coldJunctionC)} °C)";
    }

    /// <summary>The thermocouple type.</summary>
    public ThermocoupleType Type { get; }

    /// <summary>Cold-junction (reference-junction) temperature, °C.</summary>
    public double ColdJunctionC { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public string RawUnit => RawUnits.Millivolt;

    /// <inheritdoc />
    public double MinC => _function.MinC;

    /// <inheritdoc />
    public double MaxC => _function.MaxC;

    /// <summary>Lowest measurable emf with this cold junction, mV.</summary>
    public double MinMillivolts => _function.MinEmfMillivolts - _coldJunctionEmfMillivolts;

    /// <summary>Highest measurable emf with this cold junction, mV.</summary>
    public double MaxMillivolts => _function.MaxEmfMillivolts - _coldJunctionEmfMillivolts;

    /// <summary>Checks the cold-junction temperature; messages start with the field (coldJunctionC).</summary>
    public static IReadOnlyList<string> Validate(ThermocoupleType type, double coldJunctionC)
    {
        var errors = new List<string>();
        if (!Enum.IsDefined(type))
        {
            errors.Add($"type: {type} is not a supported thermocouple type; use K or T");
            return errors;
        }

        var function = ThermocoupleReferenceFunction.For(type);
        if (!double.IsFinite(coldJunctionC) || !function.Contains(coldJunctionC))
        {
            errors.Add(
                $"coldJunctionC: {RangeText.Number(coldJunctionC)} °C is outside the type {type} range {RangeText.Number(function.MinC)} to {RangeText.Number(function.MaxC)} °C");
        }

        return errors;
    }

    /// <inheritdoc />
    public ConversionResult FromCelsius(double celsius)
    {
        if (!double.IsFinite(celsius))
        {
            return ConversionResult.Failure($"temperature is not a finite number; {Name} needs °C");
        }

        return _function.Contains(celsius)
            ? ConversionResult.Success(_function.EmfUnchecked(celsius) - _coldJunctionEmfMillivolts)
            : RangeText.TemperatureOutOfRange(this, celsius);
    }

    /// <inheritdoc />
    public ConversionResult ToCelsius(double raw)
    {
        if (!double.IsFinite(raw))
        {
            return RangeText.NotANumber(this, "emf");
        }

        if (raw < MinMillivolts || raw > MaxMillivolts)
        {
            return RangeText.RawOutOfRange(this, "emf", raw, MinMillivolts, MaxMillivolts);
        }

        // Clamp guards the last bit of rounding in raw + E(t_cj) at the ends of the range.
        var emf = Math.Clamp(raw + _coldJunctionEmfMillivolts, _function.MinEmfMillivolts, _function.MaxEmfMillivolts);
        return ConversionResult.Success(_function.TemperatureUnchecked(emf));
    }

    /// <inheritdoc />
    public double SensitivityRawPerC(double celsius) => _function.SeebeckMillivoltsPerC(celsius);
}
