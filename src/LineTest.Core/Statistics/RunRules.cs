namespace LineTest.Core.Statistics;

/// <summary>
/// Run rules for a control chart: Western Electric zone rules 1–4 (Statistical Quality Control Handbook,
/// 1956) and Nelson rules 1–8 (Journal of Quality Technology 16(4), 1984).
/// </summary>
/// <remarks>
/// Zones are measured in σ from the centre line: "beyond kσ" means strictly beyond; a point exactly on the
/// centre line is on neither side and breaks a same-side run; equal neighbours break a trend or an alternation.
/// Rules on consecutive points (runs, trends, alternation, stratification, mixture) give one signal per maximal
/// run; "k of m" rules give one signal per point beyond the zone that completes k of the last m. O(n).
/// Counts are of points: Nelson 3 is six points (five steps in one direction), Nelson 4 fourteen points
/// (thirteen steps alternating in sign). On long in-control series every rule still fires now and then by
/// chance (each has a false-alarm rate of a fraction of a percent), so expect signals on large data sets.
/// </remarks>
public static class RunRules
{
    /// <summary>Evaluates every rule of both families.</summary>
    /// <param name="values">Points in time order.</param>
    /// <param name="centre">Centre line.</param>
    /// <param name="sigma">σ used for the zones; must be finite and &gt; 0.</param>
    /// <returns>Signals ordered by family, rule and index.</returns>
    public static IReadOnlyList<RunRuleSignal> Evaluate(ReadOnlySpan<double> values, double centre, double sigma)
    {
        if (!double.IsFinite(centre))
        {
            throw new ArgumentOutOfRangeException(nameof(centre), centre, "The centre line must be a finite number.");
        }

        if (!(sigma > 0) || !double.IsFinite(sigma))
        {
            throw new ArgumentOutOfRangeException(nameof(sigma), sigma, "Run rules need a finite σ > 0 for the zones.");
        }

        var z = new double[values.Length];
        for (var i = 0; i < values.Length; i++)
        {
            if (!double.IsFinite(values[i]))
            {
                throw new ArgumentException($"values[{i}] is {values[i]}; a control chart needs finite points.", nameof(values));
            }

            z[i] = (values[i] - centre) / sigma;
        }

        // Rules that look at the same points share one pass: Western Electric 1–3 are Nelson 1, 5 and 6, and the two
        // same-side rules differ only in length; trend and alternation read the same steps, and the two banded rules
        // the same zone. Each signal is still made per rule, and the list comes out by family, rule and index.
        const RunRuleFamily we = RunRuleFamily.WesternElectric;
        const RunRuleFamily ne = RunRuleFamily.Nelson;
        var beyond3 = new List<RunRuleSignal>();
        BeyondLimit(z, beyond3);
        var twoOfThree = new List<RunRuleSignal>();
        KOfM(z, 2, 3, 2.0, "2 of 3 points beyond 2σ on the same side", twoOfThree);
        var fourOfFive = new List<RunRuleSignal>();
        KOfM(z, 4, 5, 1.0, "4 of 5 points beyond 1σ on the same side", fourOfFive);
        var (eightSameSide, nineSameSide) = (new List<RunRuleSignal>(), new List<RunRuleSignal>());
        SameSide(z, eightSameSide, nineSameSide);
        var (trend, alternating) = (new List<RunRuleSignal>(), new List<RunRuleSignal>());
        Steps(z, trend, alternating);
        var (within, outside) = (new List<RunRuleSignal>(), new List<RunRuleSignal>());
        Banded(z, within, outside);

        var signals = new List<RunRuleSignal>(
            (2 * (beyond3.Count + twoOfThree.Count + fourOfFive.Count)) + eightSameSide.Count + nineSameSide.Count
            + trend.Count + alternating.Count + within.Count + outside.Count);
        Add(signals, beyond3, we, 1);
        Add(signals, twoOfThree, we, 2);
        Add(signals, fourOfFive, we, 3);
        Add(signals, eightSameSide, we, 4);
        Add(signals, beyond3, ne, 1);
        Add(signals, nineSameSide, ne, 2);
        Add(signals, trend, ne, 3);
        Add(signals, alternating, ne, 4);
        Add(signals, twoOfThree, ne, 5);
        Add(signals, fourOfFive, ne, 6);
        Add(signals, within, ne, 7);
        Add(signals, outside, ne, 8);
        return signals;
    }

    /// <summary>Adds the signals found by a pass as the given rule's (their points are shared: nothing changes them).</summary>
    private static void Add(List<RunRuleSignal> signals, List<RunRuleSignal> found, RunRuleFamily family, int rule)
    {
        foreach (var signal in found)
        {
            signals.Add(signal with { Family = family, Rule = rule });
        }
    }

    private static void BeyondLimit(double[] z, List<RunRuleSignal> signals)
    {
        for (var i = 0; i < z.Length; i++)
        {
            if (Math.Abs(z[i]) > 3)
            {
                signals.Add(new RunRuleSignal(default, 0, i, [i], "1 point beyond 3σ"));
            }
        }
    }

    /// <summary>
    /// k of the last m points (the point itself among them) beyond the zone on its side; the points beyond on either
    /// side are counted as the window slides, and only a point that completes k is looked at again.
    /// </summary>
    private static void KOfM(double[] z, int k, int m, double zone, string text, List<RunRuleSignal> signals)
    {
        var (above, below) = (0, 0);
        for (var i = 0; i < z.Length; i++)
        {
            if (z[i] > zone)
            {
                above++;
            }
            else if (z[i] < -zone)
            {
                below++;
            }

            if (i >= m)
            {
                var leaving = z[i - m];
                if (leaving > zone)
                {
                    above--;
                }
                else if (leaving < -zone)
                {
                    below--;
                }
            }

            var side = z[i] > zone ? 1 : z[i] < -zone ? -1 : 0;
            var count = side > 0 ? above : side < 0 ? below : 0;
            if (side == 0 || count < k)
            {
                continue;
            }

            var first = Math.Max(0, i - m + 1);
            var points = new int[count];
            var n = 0;
            for (var j = first; j <= i; j++)
            {
                if (side * z[j] > zone)
                {
                    points[n++] = j;
                }
            }

            signals.Add(new RunRuleSignal(default, 0, i, points, text));
        }
    }

    /// <summary>Maximal runs of points on one side of the centre line: 8 or more, and 9 or more.</summary>
    private static void SameSide(double[] z, List<RunRuleSignal> eight, List<RunRuleSignal> nine)
    {
        const string eightText = "8 points in a row on one side of the centre line";
        const string nineText = "9 points in a row on one side of the centre line";
        var start = 0;
        for (var i = 0; i <= z.Length; i++)
        {
            var continues = i < z.Length && i > start && Sign(z[i]) != 0 && Sign(z[i]) == Sign(z[start]);
            if (continues)
            {
                continue;
            }

            if (i > start && Sign(z[start]) != 0)
            {
                var points = Emit(start, i - 1, 8, eightText, eight);
                Emit(start, i - 1, 9, nineText, nine, points);
            }

            start = i;
        }
    }

    /// <summary>
    /// Both rules on the steps between points: maximal runs of steps of one non-zero sign (6 or more points steadily
    /// rising or falling) and of steps alternating in sign (14 or more points).
    /// </summary>
    private static void Steps(double[] z, List<RunRuleSignal> trend, List<RunRuleSignal> alternating)
    {
        const string trendText = "6 points in a row steadily rising or falling";
        const string alternatingText = "14 points in a row alternating up and down";
        var (trendStart, direction) = (0, 0);
        var (alternatingStart, previous) = (0, 0);
        for (var i = 1; i <= z.Length; i++)
        {
            var step = i < z.Length ? Sign(z[i] - z[i - 1]) : 0;
            if (step != 0 && (direction == 0 || step == direction))
            {
                direction = step;
            }
            else
            {
                Emit(trendStart, i - 1, 6, trendText, trend);
                trendStart = step == 0 ? i : i - 1;
                direction = step;
            }

            if (step != 0 && (previous == 0 || step == -previous))
            {
                previous = step;
            }
            else
            {
                Emit(alternatingStart, i - 1, 14, alternatingText, alternating);
                alternatingStart = step == 0 ? i : i - 1;
                previous = step;
            }
        }
    }

    /// <summary>Maximal runs of points within 1σ of the centre line (15 or more), and beyond 1σ either side (8 or more).</summary>
    private static void Banded(double[] z, List<RunRuleSignal> within, List<RunRuleSignal> outside)
    {
        const string withinText = "15 points in a row within 1σ of the centre line";
        const string outsideText = "8 points in a row beyond 1σ, either side";
        var (withinStart, outsideStart) = (-1, -1);
        for (var i = 0; i <= z.Length; i++)
        {
            var a = i < z.Length ? Math.Abs(z[i]) : double.NaN;
            if (a < 1)
            {
                withinStart = withinStart < 0 ? i : withinStart;
            }
            else if (withinStart >= 0)
            {
                Emit(withinStart, i - 1, 15, withinText, within);
                withinStart = -1;
            }

            if (a > 1)
            {
                outsideStart = outsideStart < 0 ? i : outsideStart;
            }
            else if (outsideStart >= 0)
            {
                Emit(outsideStart, i - 1, 8, outsideText, outside);
                outsideStart = -1;
            }
        }
    }

    /// <summary>The sign of a finite number (the points are checked finite first), without Math.Sign's NaN check.</summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static int Sign(double x) => x > 0 ? 1 : x < 0 ? -1 : 0;

    /// <summary>
    /// A signal for the maximal run first…last when it has at least <paramref name="length"/> points; its points are
    /// <paramref name="points"/> when given (the same run, found for another rule). Returns the run's points, or null
    /// when the run is too short.
    /// </summary>
    private static int[]? Emit(int first, int last, int length, string text, List<RunRuleSignal> signals, int[]? points = null)
    {
        var count = last - first + 1;
        if (count < length)
        {
            return null;
        }

        if (points is null)
        {
            points = new int[count];
            for (var j = 0; j < count; j++)
            {
                points[j] = first + j;
            }
        }

        signals.Add(new RunRuleSignal(default, 0, first + length - 1, points, text));
        return points;
    }
}
