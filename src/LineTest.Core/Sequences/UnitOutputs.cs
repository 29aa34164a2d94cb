namespace LineTest.Core.Sequences;

/// <summary>
/// Where the station reads a unit's value (the <c>output</c> key of measure and verify steps and of the soak).
/// </summary>
/// <remarks>
/// <para><c>meter</c> (the default): volts on the slot's output channel of the fixture's voltmeter (analog units).</para>
/// <para><c>link</c>: over the unit's own serial link (digital units): a measure step and the soak read the raw
/// sensor value in ADC counts, before any correction (what firmware coefficients apply to); a verify step reads the
/// temperature the unit itself reports, with its coefficients applied.</para>
/// </remarks>
public static class UnitOutputs
{
    /// <summary>Volts on the slot's output channel.</summary>
    public const string Meter = "meter";

    /// <summary>The unit's own link: raw counts (measure, soak) or its reported temperature (verify).</summary>
    public const string Link = "link";

    /// <summary>Every accepted word.</summary>
    public static IReadOnlyList<string> All { get; } = [Meter, Link];
}
