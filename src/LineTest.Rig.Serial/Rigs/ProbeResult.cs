namespace LineTest.Rig.Serial.Rigs;

/// <summary>What a probe found on one instrument.</summary>
/// <param name="Instrument">Instrument name, e.g. <c>meter</c>, <c>unit slot 2</c>.</param>
/// <param name="Port">Its port.</param>
/// <param name="Status">Usable, no unit, or unusable.</param>
/// <param name="Identity">What it said it is, or null.</param>
/// <param name="Reading">One reading with its unit, or null.</param>
/// <param name="Problem">Why it is not usable (or why no unit answered), or null.</param>
public sealed record ProbeResult(string Instrument, string Port, ProbeStatus Status, string? Identity, string? Reading, string? Problem);
