namespace LineTest.Factory.Reporting;

/// <summary>What a reading shares with most others of its name: the name, unit and limits.</summary>
internal readonly record struct ReadingShape(string Name, string Unit, double? Low, double? High);
