namespace LineTest.Core.Characterisation;

/// <summary>One point of a forward I–V sweep: the forced current and the voltage measured across the junction.</summary>
/// <param name="CurrentAmps">Forced forward current, amperes.</param>
/// <param name="Volts">Measured forward voltage, volts.</param>
public readonly record struct IvPoint(double CurrentAmps, double Volts);
