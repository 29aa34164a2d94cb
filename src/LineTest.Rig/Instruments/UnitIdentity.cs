namespace LineTest.Rig.Instruments;

/// <summary>What a unit says about itself when identified.</summary>
public sealed record UnitIdentity(string Serial, string Product, string Firmware);
