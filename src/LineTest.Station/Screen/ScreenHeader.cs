namespace LineTest.Station.Screen;

/// <summary>The facts in the screen's header.</summary>
public sealed record ScreenHeader(string Station, string Fixture, string Sequence, int Revision, string? Lot, string? Operator, string Mode);
