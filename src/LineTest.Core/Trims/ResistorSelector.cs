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

        // Series R1 + R2 ≈ R*: the larger part R1 is at least a third of R* for any pair worth having. For
        // each R1 both series values bracketing R* − R1 are tried (the sum is linear in R2, so the
        // nearest in log space is not always the best).
        foreach (var r1 in parts)
        {
            if (r1 < idealOhms / 3 || r1 >= idealOhms)
            {
                continue;
            }

            foreach (var r2 in Bracket(parts, idealOhms - r1))
            {
                Consider(ResistorConnection.Series, r1, r2);
            }
        }

        // Parallel R1·R2/(R1 + R2) ≈ R*: the smaller part R1 lies between R*/2 and 3R* for any pair worth
        // having; both values bracketing 1/(1/R* − 1/R1) are tried.
        foreach (var r1 in parts)
        {
            if (r1 <= idealOhms / 2 || r1 > 3 * idealOhms)
            {
                continue;
            }

            var conductance = (1.0 / idealOhms) - (1.0 / r1);
            if (conductance <= 0.0)
            {
                // R1 ≤ R*: R2 must make up for nothing (or less than nothing); try the largest parts.
                Consider(ResistorConnection.Parallel, r1, parts[^1]);
                continue;
            }

            foreach (var r2 in Bracket(parts, 1.0 / conductance))
            {
                Consider(ResistorConnection.Parallel, r1, r2);
            }
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

    /// <summary>The series values just below and just above <paramref name="ohms"/> (one value at either end).</summary>
    private static IEnumerable<double> Bracket(IReadOnlyList<double> sortedValues, double ohms)
    {
        var lo = 0;
        var hi = sortedValues.Count - 1;
        if (ohms <= sortedValues[lo])
        {
            yield return sortedValues[lo];
            yield break;
        }

        if (ohms >= sortedValues[hi])
        {
            yield return sortedValues[hi];
            yield break;
        }

        // Invariant: sortedValues[lo] < ohms ≤ sortedValues[hi].
        while (hi - lo > 1)
        {
            var mid = (lo + hi) / 2;
            if (sortedValues[mid] < ohms)
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        yield return sortedValues[lo];
        yield return sortedValues[hi];
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
