namespace LineTest.Reports.Loading;

/// <summary>
/// The outcome of reading a readings CSV: the data (when usable), the rows that were not, or a reason the
/// whole file could not be used (missing columns, a filter the file cannot answer).
/// </summary>
public sealed record CsvLoadResult
{
    /// <summary>The data; null when <see cref="FileError"/> is set, or when bad rows were found and not to be skipped.</summary>
    public ReportData? Data { get; init; }

    /// <summary>Rows that could not be used, in file order.</summary>
    public IReadOnlyList<CsvRowProblem> BadRows { get; init; } = [];

    /// <summary>Why the whole file could not be used; null otherwise.</summary>
    public string? FileError { get; init; }

    /// <summary>True when <see cref="Data"/> can be reported on.</summary>
    public bool IsUsable => Data is not null;
}
