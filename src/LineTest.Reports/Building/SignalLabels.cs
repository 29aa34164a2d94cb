using System.Globalization;
using LineTest.Core.Statistics;

namespace LineTest.Reports.Building;

/// <summary>Short names of run rules in reports: "WE1"…"WE4" (Western Electric), "N1"…"N8" (Nelson).</summary>
public static class SignalLabels
{
    /// <summary>
    /// Every short name with its rule, for the legend every report format carries (Western Electric Statistical
    /// Quality Control Handbook, 1956; Nelson, Journal of Quality Technology 16(4), 1984).
    /// </summary>
    public static IReadOnlyList<(string Label, string Rule)> Legend { get; } =
    [
        ("WE1", "1 point beyond 3σ (the control limits)"),
        ("WE2", "2 of 3 points beyond 2σ on the same side"),
        ("WE3", "4 of 5 points beyond 1σ on the same side"),
        ("WE4", "8 points in a row on one side of the centre line"),
        ("N1", "1 point beyond 3σ (the control limits)"),
        ("N2", "9 points in a row on one side of the centre line"),
        ("N3", "6 points in a row steadily rising or falling"),
        ("N4", "14 points in a row alternating up and down"),
        ("N5", "2 of 3 points beyond 2σ on the same side"),
        ("N6", "4 of 5 points beyond 1σ on the same side"),
        ("N7", "15 points in a row within 1σ of the centre line"),
        ("N8", "8 points in a row beyond 1σ on either side"),
    ];

    /// <summary>The rule's short name, e.g. "WE2" or "N5".</summary>
    public static string Label(RunRuleSignal signal)
    {
        ArgumentNullException.ThrowIfNull(signal);
        return Label(signal.Family, signal.Rule);
    }

    /// <summary>The short name of rule <paramref name="rule"/> of <paramref name="family"/>.</summary>
    public static string Label(RunRuleFamily family, int rule) => family switch
    {
        RunRuleFamily.WesternElectric => "WE" + rule.ToString(CultureInfo.InvariantCulture),
        RunRuleFamily.Nelson => "N" + rule.ToString(CultureInfo.InvariantCulture),
        _ => throw new ArgumentOutOfRangeException(nameof(family), family, "Unknown run-rule family."),
    };

    /// <summary>Signal counts per rule in rule order, e.g. "WE1×2 N1×2 N5×1"; "none" when there are none.</summary>
    /// <param name="signals">The signals.</param>
    /// <param name="times">Text between rule and count ("×" on screen, "=" in CSV).</param>
    public static string Summary(IReadOnlyList<RunRuleSignal> signals, string times = "×")
    {
        ArgumentNullException.ThrowIfNull(signals);
        if (signals.Count == 0)
        {
            return "none";
        }

        var counts = new SortedDictionary<(RunRuleFamily, int), int>();
        foreach (var s in signals)
        {
            counts[(s.Family, s.Rule)] = counts.TryGetValue((s.Family, s.Rule), out var c) ? c + 1 : 1;
        }

        return string.Join(" ", counts.Select(kv => string.Create(CultureInfo.InvariantCulture, $"{Label(kv.Key.Item1, kv.Key.Item2)}{times}{kv.Value}")));
    }
}
