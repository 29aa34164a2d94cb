namespace LineTest.Storage.Sqlite;

/// <summary>One reading as a report needs it: its run's <c>seq</c>, its name, value, unit and limits.</summary>
/// <param name="RunSeq">The run's insertion order (<c>runs.seq</c>).</param>
/// <param name="Name">Reading name (the same string instance for every reading of one name in a scan).</param>
/// <param name="Value">The value; null when not obtained.</param>
/// <param name="Unit">Unit symbol (shared like <paramref name="Name"/>).</param>
/// <param name="Low">Low limit, if any.</param>
/// <param name="High">High limit, if any.</param>
public readonly record struct ReadingValue(long RunSeq, string Name, double? Value, string Unit, double? Low, double? High);
