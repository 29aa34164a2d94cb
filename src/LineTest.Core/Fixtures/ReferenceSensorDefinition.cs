namespace LineTest.Core.Fixtures;

/// <summary>
/// Which reference sensor a fixture uses and its coefficients.
/// <c>kind</c>: <c>prt</c> (Callendar–Van Dusen, IEC 60751: r0, a, b, c),
/// <c>thermistor</c> (Steinhart–Hart a, b, c, or beta model r25 and beta),
/// <c>thermocouple</c> (type K or T, cold junction °C), or <c>celsius</c> (a readout that reports °C).
/// Missing PRT coefficients default to the IEC 60751 values.
/// </summary>
public sealed record ReferenceSensorDefinition
{
    /// <summary>prt, thermistor, thermocouple or celsius.</summary>
    public required string Kind { get; init; }

    /// <summary>PRT: resistance at 0 °C, Ω (100 for Pt100, 1000 for Pt1000).</summary>
    public double? R0 { get; init; }

    /// <summary>PRT: Callendar–Van Dusen A; thermistor: Steinhart–Hart A.</summary>
    public double? A { get; init; }

    /// <summary>PRT: Callendar–Van Dusen B; thermistor: Steinhart–Hart B.</summary>
    public double? B { get; init; }

    /// <summary>PRT: Callendar–Van Dusen C; thermistor: Steinhart–Hart C.</summary>
    public double? C { get; init; }

    /// <summary>Thermistor beta model: resistance at 25 °C, Ω.</summary>
    public double? R25 { get; init; }

    /// <summary>Thermistor beta model: beta, K.</summary>
    public double? Beta { get; init; }

    /// <summary>Thermocouple type: K or T.</summary>
    public string? Type { get; init; }

    /// <summary>Thermocouple cold-junction temperature, °C.</summary>
    public double? ColdJunctionC { get; init; }
}
