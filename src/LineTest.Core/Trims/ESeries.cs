namespace LineTest.Core.Trims;

/// <summary>
/// A series of preferred resistor values per IEC 60063:2015: the mantissas of one decade, repeated in
/// every decade (…, 47 Ω, 470 Ω, 4.7 kΩ, …).
/// </summary>
/// <remarks>
/// E24 (and so E12) is the published table, not the rounded formula 10^(i/24): eight values differ
/// (2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2, which the formula would give as 2.6, 2.9, 3.2, 3.5, 3.8,
/// 4.2, 4.6 and 8.3). E96 is round(10^(i/96), 2) for i = 0…95 with no exception; E48 is every second E96
/// value and E12 every second E24 value (IEC 60063:2015).
/// Values are held as integer hundredths so that decade scaling is exact (4.7 → 4700 Ω, not 4700.000000001).
/// </remarks>
public sealed class ESeries
{
    // IEC 60063:2015, E24 table [published].
    private static readonly int[] E24Hundredths =
    [
        100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300,
        330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820, 910,
    ];

    private readonly int[] _hundredths;

    private ESeries(string name, int[] hundredths, int significantDigits)
    {
        Name = name;
        _hundredths = hundredths;
        SignificantDigits = significantDigits;
        Mantissas = hundredths.Select(h => h / 100.0).ToArray();
    }

    /// <summary>E12: every second E24 value; 10 % parts.</summary>
    public static ESeries E12 { get; } = new("E12", E24Hundredths.Where((_, i) => i % 2 == 0).ToArray(), 2);

    /// <summary>E24: the published table; 5 % parts.</summary>
    public static ESeries E24 { get; } = new("E24", E24Hundredths, 2);

    /// <summary>E48: every second E96 value; 2 % parts.</summary>
    public static ESeries E48 { get; } = new("E48", E96Hundredths().Where((_, i) => i % 2 == 0).ToArray(), 3);

    /// <summary>E96: round(10^(i/96), 2); 1 % parts.</summary>
    public static ESeries E96 { get; } = new("E96", E96Hundredths(), 3);

    /// <summary>The series name as written in a sequence: <c>E12</c>, <c>E24</c>, <c>E48</c> or <c>E96</c>.</summary>
    public string Name { get; }

    /// <summary>Mantissas of one decade, 1.0 ≤ m &lt; 10, ascending.</summary>
    public IReadOnlyList<double> Mantissas { get; }

    /// <summary>Significant digits of the series' values (2 for E12/E24, 3 for E48/E96).</summary>
    public int SignificantDigits { get; }

    /// <summary>Finds a series by name (case-insensitive); false for anything else.</summary>
    public static bool TryParse(string? name, [System.Diagnostics.CodeAnalysis.NotNullWhen(true)] out ESeries? series)
    {
        series = name?.Trim().ToUpperInvariant() switch
        {
            "E12" => E12,
            "E24" => E24,
            "E48" => E48,
            "E96" => E96,
            _ => null,
        };
        return series is not null;
    }

    /// <summary>The value of mantissa index <paramref name="index"/> in decade 10^<paramref name="decade"/>, ohms.</summary>
    public double ValueAt(int index, int decade)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(index);
        ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual(index, _hundredths.Length);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(Math.Abs(decade), 15);

        // hundredths·10^(decade − 2), by multiplying or dividing by an exact power of ten.
        var shift = decade - 2;
        return shift >= 0 ? _hundredths[index] * Math.Pow(10, shift) : _hundredths[index] / Math.Pow(10, -shift);
    }

    /// <summary>Every value of the series from <paramref name="minOhms"/> to <paramref name="maxOhms"/> inclusive, ascending.</summary>
    public IReadOnlyList<double> ValuesBetween(double minOhms, double maxOhms)
    {
        if (!(minOhms > 0.0 && double.IsFinite(maxOhms) && minOhms <= maxOhms))
        {
            throw new ArgumentOutOfRangeException(nameof(minOhms), $"Need 0 < min ≤ max, finite; got {minOhms}…{maxOhms}.");
        }

        var values = new List<double>();
        var firstDecade = (int)Math.Floor(Math.Log10(minOhms)) - 1;
        var lastDecade = (int)Math.Floor(Math.Log10(maxOhms)) + 1;
        for (var decade = firstDecade; decade <= lastDecade; decade++)
        {
            for (var i = 0; i < _hundredths.Length; i++)
            {
                var value = ValueAt(i, decade);
                if (value >= minOhms && value <= maxOhms)
                {
                    values.Add(value);
                }
            }
        }

        return values;
    }

    /// <summary>The series value nearest to <paramref name="ohms"/> in log space (equal ratios, not equal differences).</summary>
    public double Nearest(double ohms)
    {
        if (!(ohms > 0.0 && double.IsFinite(ohms)))
        {
            throw new ArgumentOutOfRangeException(nameof(ohms), ohms, "Resistance must be positive and finite.");
        }

        var decade = (int)Math.Floor(Math.Log10(ohms));
        var best = double.NaN;
        var bestDistance = double.PositiveInfinity;

        // Candidates: this decade's values, the first value of the next decade, and (against a
        // floor() that lands one decade high through rounding) the previous decade's values.
        for (var d = decade - 1; d <= decade + 1; d++)
        {
            for (var i = 0; i < _hundredths.Length; i++)
            {
                var candidate = ValueAt(i, d);
                var distance = Math.Abs(Math.Log(candidate / ohms));
                if (distance < bestDistance)
                {
                    best = candidate;
                    bestDistance = distance;
                }
            }
        }

        return best;
    }

    /// <inheritdoc />
    public override string ToString() => Name;

    private static int[] E96Hundredths() =>
        Enumerable.Range(0, 96).Select(i => (int)Math.Round(100 * Math.Pow(10, i / 96.0), MidpointRounding.AwayFromZero)).ToArray();
}
