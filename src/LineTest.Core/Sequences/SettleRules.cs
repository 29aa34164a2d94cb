using System.Globalization;
using LineTest.Core.Definitions;

namespace LineTest.Core.Sequences;

/// <summary>Checks a sequence's <c>settle</c> settings and each setpoint's own, each problem at its JSON path.</summary>
public static class SettleRules
{
    /// <summary>Adds every problem of the settle settings to <paramref name="problems"/>.</summary>
    public static void Check(SequenceDefinition sequence, ProblemList problems)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(problems);
        if (sequence.Settle is { } settle)
        {
            CheckOne(settle, "$.settle", sequence.Stability, problems);
        }

        for (var i = 0; i < sequence.Setpoints.Count; i++)
        {
            if (sequence.Setpoints[i].Settle is { } own)
            {
                CheckOne(own, $"$.setpoints[{i}].settle", sequence.Stability, problems);
            }
        }
    }

    private static void CheckOne(SettleSettings settle, string path, StabilitySettings stability, ProblemList problems)
    {
        if (!SettleModes.All.Contains(settle.Mode, StringComparer.Ordinal))
        {
            // Not returning: the uncertainty beside an unknown mode is still checked, so every problem is listed at once.
            problems.Add($"{path}.mode", $"'{settle.Mode}' is not a settle mode: use {string.Join(" or ", SettleModes.All.Select(m => $"\"{m}\""))}");
        }

        if (settle.MaxExtrapolationUncertaintyC is not { } u)
        {
            problems.AddIf(settle.Mode == SettleModes.Predictive, $"{path}.maxExtrapolationUncertaintyC",
                "predictive mode needs the largest extrapolation uncertainty it may accept, °C");
            return;
        }

        if (!DefinitionBounds.TemperatureBandC.Check(u, $"{path}.maxExtrapolationUncertaintyC", problems))
        {
            return;
        }

        // A prediction less certain than the band cannot show that the source will settle inside it.
        problems.AddIf(stability.BandC > 0 && u >= stability.BandC, $"{path}.maxExtrapolationUncertaintyC",
            $"{F(u)} °C is not smaller than the stability band ({F(stability.BandC)} °C)");
    }

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
