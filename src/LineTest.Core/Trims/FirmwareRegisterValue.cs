namespace LineTest.Core.Trims;

/// <summary>One coefficient as fitted, as quantised into its register, and as the firmware will use it.</summary>
/// <param name="Register">Register name.</param>
/// <param name="IdealCoefficient">The fitted coefficient.</param>
/// <param name="Value">The integer register value to write (rounded half away from zero; not clamped).</param>
/// <param name="Coefficient">The coefficient the firmware will use: Value·LSB.</param>
/// <param name="Lsb">Weight of one register count.</param>
public sealed record FirmwareRegisterValue(string Register, double IdealCoefficient, long Value, double Coefficient, double Lsb);
