namespace LineTest.Core.Results;

/// <summary>
/// The trim computed for a unit: what went in, what came out, and the error it predicts at each setpoint.
/// Values are keyed by stable names (e.g. <c>gainCode</c>, <c>offsetCode</c>, <c>R7</c>).
/// </summary>
/// <param name="Method">dac, resistor or firmware.</param>
/// <param name="Inputs">Fit results and other inputs to the trim.</param>
/// <param name="Values">The trim itself: codes, resistor values (Ω) or coefficients.</param>
/// <param name="PredictedErrorC">Predicted remaining error in °C, keyed by setpoint name.</param>
/// <param name="InRange">False when the trim needed is outside what the product allows.</param>
/// <param name="Instructions">Operator instructions (e.g. which resistor to fit where), if any.</param>
public sealed record TrimRecord(
    string Method,
    IReadOnlyDictionary<string, double> Inputs,
    IReadOnlyDictionary<string, double> Values,
    IReadOnlyDictionary<string, double> PredictedErrorC,
    bool InRange,
    IReadOnlyList<string> Instructions);
