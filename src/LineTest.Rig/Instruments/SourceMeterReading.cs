namespace LineTest.Rig.Instruments;

/// <summary>One voltage measurement of a source-measure unit.</summary>
/// <param name="Volts">The measured voltage, volts (at the limit when in compliance).</param>
/// <param name="InCompliance">
/// True when the source could not force the set current without exceeding its voltage limit: the load is open or
/// far more resistive than expected, and <paramref name="Volts"/> is the limit, not the load's voltage at that current.
/// </param>
public readonly record struct SourceMeterReading(double Volts, bool InCompliance);
