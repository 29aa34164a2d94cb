namespace LineTest.Core.Trims;

/// <summary>
/// Picks the standard part, or where allowed the pair of parts in series or in parallel, closest to an
/// ideal resistance in log space (equal ratio errors count equally, whatever the decade).
/// </summary>
public static class ResistorSelector
{
    /// <summary>
    /// A pair replaces the best single part only when it more than halves the ratio error: a second part
    /// costs a placement and a solder joint, so a marginal gain is not worth it.
    /// </summary>
    public const double PairImprovementFactor = 0.5;

    /// <summary>
    /// Chooses parts for <paramref name="position"/>. The effective value is kept within
    /// [<paramref name="minOhms"/>, <paramref name="maxOhms"/>] when any series value or pair there can be used;
    /// if the ideal itself lies outside, the nearest series value is returned and the caller reports the range.
    /// </summary>
    public static ResistorChoice Choose(
        string position, double idealOhms, ESeries series, bool allowPairs, double minOhms, double maxOhms)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(position);
        ArgumentNullException.ThrowIfNull(series);
        if (!(idealOhms > 0.0 && double.IsFinite(idealOhms)))
        {
            throw new ArgumentOutOfRangeException(nameof(idealOhms), idealOhms, $"{position}: ideal resistance must be positive and finite.");
        }

        if (!(minOhms > 0.0 && minOhms <= maxOhms && double.IsFinite(maxOhms)))
        {
            throw new ArgumentOutOfRangeException(nameof(minOhms), $"{position}: need 0 < min ≤ max; got {minOhms}…{maxOhms}.");
        }

        var inRange = series.ValuesBetween(minOhms, maxOhms);
        double single;
        if (inRange.Count == 0 || idealOhms < minOhms || idealOhms > maxOhms)
        {
            single = inRange.Count == 0 ? series.Nearest(idealOhms) : Closest(inRange, idealOhms);
            return Make(ResistorConnection.Single, [single]);
        }

        single = Closest(inRange, idealOhms);
        var best = Make(ResistorConnection.Single, [single]);
        if (!allowPairs)
        {
            return best;
        }

        var bestPair = (Error: double.PositiveInfinity, Choice: best);

        // Parts themselves may come from a wider span than the effective range: a series pair uses a small
        // second part, a parallel pair a large one. Keep them within 1 Ω … 100 MΩ, the span of ordinary parts.
        var parts = series.ValuesBetween(1.0, 1e8);

        // Series R1 + R2 = R*, R1 the larger part: R1 ∈ [R*/2, R*), R2 nearest to R* − R1.
        foreach (var r1 in parts)
        {
            if (r1 < idealOhms / 2 || r1 >= idealOhms)
            {
                continue;
            }

            var rest = idealOhms - r1;
            if (rest < parts[0])
            {
                continue;
            }

            var r2 = Closest(parts, rest);
            Consider(ResistorConnection.Series, r1, r2);
        }

        // Parallel R1·R2/(R1 + R2) = R*, R1 the smaller part: R1 ∈ (R*, 2R*], R2 nearest to 1/(1/R* − 1/R1).
        foreach (var r1 in parts)
        {
            if (r1 <= idealOhms || r1 > 2 * idealOhms)
            {
                continue;
            }

            var other = 1.0 / ((1.0 / idealOhms) - (1.0 / r1));
            if (other > parts[^1])
            {
                continue;
            }

            var r2 = Closest(parts, other);
            Consider(ResistorConnection.Parallel, r1, r2);
        }

        return bestPair.Error < PairImprovementFactor * LogError(best.EffectiveOhms) ? bestPair.Choice : best;

        void Consider(ResistorConnection connection, double r1, double r2)
        {
            var choice = Make(connection, r1 >= r2 ? [r1, r2] : [r2, r1]);
            var effective = choice.EffectiveOhms;
            var error = LogError(effective);
            if (effective >= minOhms && effective <= maxOhms && error < bestPair.Error)
            {
                bestPair = (error, choice);
            }
        }

        double LogError(double ohms) => Math.Abs(Math.Log(ohms / idealOhms));

        ResistorChoice Make(ResistorConnection connection, double[] values) => new()
        {
            Position = position,
            IdealOhms = idealOhms,
            Connection = connection,
            Parts = values,
            Series = series,
        };
    }

    private static double Closest(IReadOnlyList<double> sortedValues, double ohms)
    {
        var best = sortedValues[0];
        var bestDistance = double.PositiveInfinity;
        foreach (var value in sortedValues)
        {
            var distance = Math.Abs(Math.Log(value / ohms));
            if (distance < bestDistance)
            {
                best = value;
                bestDistance = distance;
            }
        }

        return best;
    }
}
