using LineTest.Core.Results;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The <c>readings</c> columns copied from each reading of <c>run_json</c> (after <c>run_seq</c> and
/// <c>run_id</c>), and their values. Shared by the store and the chain verifier.
/// </summary>
internal static class ReadingColumns
{
    public static readonly string[] Names =
    [
        "ordinal", "name", "value", "unit", "low", "high", "verdict", "step", "setpoint", "uncertainty",
        "standard_uncertainty", "coverage_factor", "decision_rule", "acceptance_low", "acceptance_high",
        "samples", "note", "at_utc",
    ];

    public static object?[] Values(Reading reading, int ordinal) =>
    [
        (long)ordinal,
        reading.Name,
        Real(reading.Value),
        reading.Unit,
        Real(reading.Low),
        Real(reading.High),
        reading.Verdict.ToWord(),
        reading.Step,
        reading.Setpoint,
        Real(reading.ExpandedUncertainty),
        Real(reading.StandardUncertainty),
        Real(reading.CoverageFactor),
        reading.DecisionRule,
        Real(reading.AcceptanceLow),
        Real(reading.AcceptanceHigh),
        reading.Samples is int samples ? (long)samples : null,
        reading.Note,
        reading.At is DateTimeOffset at ? UtcText.ToText(at) : null,
    ];

    // SQLite stores NaN as NULL; run_json keeps the NaN itself.
    private static object? Real(double? value) => value is double d && !double.IsNaN(d) ? d : null;
}
