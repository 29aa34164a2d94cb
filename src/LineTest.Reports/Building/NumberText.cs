using System.Globalization;

namespace LineTest.Reports.Building;

/// <summary>How reports print numbers: invariant culture, a dash where a value is not defined.</summary>
public static class NumberText
{
    /// <summary>Printed for a value that is not defined.</summary>
    public const string NotDefined = "—";

    /// <summary>A measured value or statistic, 5 significant digits.</summary>
    public static string Value(double? value) =>
        value is { } v && double.IsFinite(v) ? v.ToString("G5", CultureInfo.InvariantCulture) : NotDefined;

    /// <summary>A signed offset, 4 significant digits with an explicit sign.</summary>
    public static string Offset(double? value) =>
        value is { } v && double.IsFinite(v) ? (v >= 0 ? "+" : string.Empty) + v.ToString("G4", CultureInfo.InvariantCulture) : NotDefined;

    /// <summary>A capability index, 2 decimals.</summary>
    public static string Index(double? value) =>
        value is { } v && double.IsFinite(v) ? v.ToString("F2", CultureInfo.InvariantCulture) : NotDefined;

    /// <summary>A fraction as a percentage with 1 decimal, e.g. 0.945 → "94.5 %".</summary>
    public static string Percent(double? fraction) =>
        fraction is { } v && double.IsFinite(v) ? (v * 100).ToString("F1", CultureInfo.InvariantCulture) + " %" : NotDefined;

    /// <summary>Parts per million: whole numbers, one decimal below 10.</summary>
    public static string Ppm(double? value) => value switch
    {
        { } v when !double.IsFinite(v) => NotDefined,
        { } v when v < 10 => v.ToString("F1", CultureInfo.InvariantCulture),
        { } v => v.ToString("F0", CultureInfo.InvariantCulture),
        null => NotDefined,
    };

    /// <summary>A p-value, 3 decimals, "&lt;0.001" below that.</summary>
    public static string P(double? value) => value switch
    {
        { } v when !double.IsFinite(v) => NotDefined,
        { } v when v < 0.001 => "<0.001",
        { } v => v.ToString("F3", CultureInfo.InvariantCulture),
        null => NotDefined,
    };

    /// <summary>A rate such as retests per unit: always 2 decimals (0.00, 0.99, 1.13), one format for the column.</summary>
    public static string Rate(double? value) =>
        value is { } v && double.IsFinite(v) ? v.ToString("F2", CultureInfo.InvariantCulture) : NotDefined;

    /// <summary>A count with thousands separators, e.g. 1,000,000.</summary>
    public static string Count(long value) => value.ToString("N0", CultureInfo.InvariantCulture);
}
