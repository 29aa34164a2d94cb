namespace LineTest.Reports.Loading;

/// <summary>A row of a readings CSV that could not be used.</summary>
/// <param name="Line">1-based line number in the file (the header is line 1).</param>
/// <param name="Reason">What is wrong with it, in plain words.</param>
public sealed record CsvRowProblem(int Line, string Reason);
