using System.Buffers;
using System.Runtime.CompilerServices;

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

        // The points in σ from the centre line, in a pooled buffer: only the rules read them.
        var buffer = ArrayPool<double>.Shared.Rent(values.Length);
        try
        {
            return Evaluate(values, centre, sigma, buffer.AsSpan(0, values.Length));
        }
        finally
        {
            ArrayPool<double>.Shared.Return(buffer);
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static List<RunRuleSignal> Evaluate(ReadOnlySpan<double> values, double centre, double sigma, Span<double> z)
    {
        for (var i = 0; i < values.Length; i++)
        {
            if (!double.IsFinite(values[i]))
            {
                throw new ArgumentException($"values[{i}] is {values[i]}; a control chart needs finite points.", nameof(values));
            }

            z[i] = (values[i] - centre) / sigma;
        }

        // One pass finds every pattern: Western Electric 1–3 are Nelson 1, 5 and 6 and are found once, and the two
        // same-side rules differ only in length. Each signal is then made per rule, and the list comes out by family,
        // rule and index.
        const RunRuleFamily we = RunRuleFamily.WesternElectric;
        const RunRuleFamily ne = RunRuleFamily.Nelson;
        var beyond3 = new List<RunRuleSignal>();
        var twoOfThree = new List<RunRuleSignal>();
        var fourOfFive = new List<RunRuleSignal>();
        var (eightSameSide, nineSameSide) = (new List<RunRuleSignal>(), new List<RunRuleSignal>());
        var (trend, alternating) = (new List<RunRuleSignal>(), new List<RunRuleSignal>());
        var (within, outside) = (new List<RunRuleSignal>(), new List<RunRuleSignal>());
        Scan(z, new Found(beyond3, twoOfThree, fourOfFive, eightSameSide, nineSameSide, trend, alternating, within, outside));

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

    /// <summary>The patterns found, per pass result (the family and rule are set when they are added to the list).</summary>
    private sealed record Found(
        List<RunRuleSignal> Beyond3,
        List<RunRuleSignal> TwoOfThree,
        List<RunRuleSignal> FourOfFive,
        List<RunRuleSignal> EightSameSide,
        List<RunRuleSignal> NineSameSide,
        List<RunRuleSignal> Trend,
        List<RunRuleSignal> Alternating,
        List<RunRuleSignal> Within,
        List<RunRuleSignal> Outside);

    private const string Beyond3Text = "1 point beyond 3σ";
    private const string TwoOfThreeText = "2 of 3 points beyond 2σ on the same side";
    private const string FourOfFiveText = "4 of 5 points beyond 1σ on the same side";
    private const string EightText = "8 points in a row on one side of the centre line";
    private const string NineText = "9 points in a row on one side of the centre line";
    private const string TrendText = "6 points in a row steadily rising or falling";
    private const string AlternatingText = "14 points in a row alternating up and down";
    private const string WithinText = "15 points in a row within 1σ of the centre line";
    private const string OutsideText = "8 points in a row beyond 1σ, either side";

    /// <summary>
    /// Every rule in one pass over the points. The rules on consecutive points each follow a class per point (or per
    /// step between points) and end a maximal run where the class changes: the side of the centre line; within 1σ,
    /// beyond 1σ or exactly on it; the sign of the step (a trend); and the sign of the step times (−1)^i, which stays
    /// the same while the steps alternate. "k of m" rules count the points beyond the zone on either side as the window
    /// slides. The per-point work has no branch that depends on the data except where a signal is made, which is rare:
    /// on in-control data the other branches would be mispredicted about half the time.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Scan(ReadOnlySpan<double> z, Found found)
    {
        var n = z.Length;
        var (sideStart, sidePrevious) = (0, 0);
        var (bandStart, bandPrevious) = (0, 0);
        var (trendStart, trendPrevious) = (1, 0);
        var (alternatingStart, alternatingPrevious) = (1, 0);
        var (above2, below2, above1, below1) = (0, 0, 0, 0);
        for (var i = 0; i < n; i++)
        {
            var v = z[i];
            if (Math.Abs(v) > 3)
            {
                found.Beyond3.Add(new RunRuleSignal(default, 0, i, [i], Beyond3Text));
            }

            // k of m: the points beyond 2σ in the last 3, and beyond 1σ in the last 5, on each side.
            above2 += Flag(v > 2);
            below2 += Flag(v < -2);
            above1 += Flag(v > 1);
            below1 += Flag(v < -1);
            if (i >= 3)
            {
                var leaving = z[i - 3];
                above2 -= Flag(leaving > 2);
                below2 -= Flag(leaving < -2);
            }

            if (i >= 5)
            {
                var leaving = z[i - 5];
                above1 -= Flag(leaving > 1);
                below1 -= Flag(leaving < -1);
            }

            if ((v > 2 & above2 >= 2) | (v < -2 & below2 >= 2))
            {
                KOfMSignal(z, i, 3, 2.0, v > 0 ? above2 : below2, TwoOfThreeText, found.TwoOfThree);
            }

            if ((v > 1 & above1 >= 4) | (v < -1 & below1 >= 4))
            {
                KOfMSignal(z, i, 5, 1.0, v > 0 ? above1 : below1, FourOfFiveText, found.FourOfFive);
            }

            // Runs of points: the side of the centre line (0 on it), and the band (1 within 1σ, 2 beyond, 0 on 1σ).
            var side = Sign(v);
            if ((side != sidePrevious) & (sidePrevious != 0) & (i - sideStart >= 8))
            {
                var points = Emit(sideStart, i - 1, 8, EightText, found.EightSameSide);
                Emit(sideStart, i - 1, 9, NineText, found.NineSameSide, points);
            }

            sideStart = Choose(side != sidePrevious, i, sideStart);
            sidePrevious = side;

            var a = Math.Abs(v);
            var band = Flag(a < 1) + (2 * Flag(a > 1));
            if ((band != bandPrevious) & (bandPrevious != 0) & (i - bandStart >= 8))
            {
                EmitBand(bandStart, i - 1, bandPrevious, found);
            }

            bandStart = Choose(band != bandPrevious, i, bandStart);
            bandPrevious = band;

            // Runs of steps: step i is from point i − 1 to point i; steps j…k are points j − 1…k.
            if (i > 0)
            {
                var step = Sign(v - z[i - 1]);
                if ((step != trendPrevious) & (trendPrevious != 0) & (i - trendStart >= 5))
                {
                    Emit(trendStart - 1, i - 1, 6, TrendText, found.Trend);
                }

                trendStart = Choose(step != trendPrevious, i, trendStart);
                trendPrevious = step;

                var alternation = step * (1 - (2 * (i & 1)));
                if ((alternation != alternatingPrevious) & (alternatingPrevious != 0) & (i - alternatingStart >= 13))
                {
                    Emit(alternatingStart - 1, i - 1, 14, AlternatingText, found.Alternating);
                }

                alternatingStart = Choose(alternation != alternatingPrevious, i, alternatingStart);
                alternatingPrevious = alternation;
            }
        }

        // The runs still open at the last point.
        if (sidePrevious != 0)
        {
            var points = Emit(sideStart, n - 1, 8, EightText, found.EightSameSide);
            Emit(sideStart, n - 1, 9, NineText, found.NineSameSide, points);
        }

        if (bandPrevious != 0)
        {
            EmitBand(bandStart, n - 1, bandPrevious, found);
        }

        if (trendPrevious != 0)
        {
            Emit(trendStart - 1, n - 1, 6, TrendText, found.Trend);
        }

        if (alternatingPrevious != 0)
        {
            Emit(alternatingStart - 1, n - 1, 14, AlternatingText, found.Alternating);
        }
    }

    private static void EmitBand(int first, int last, int band, Found found)
    {
        if (band == 1)
        {
            Emit(first, last, 15, WithinText, found.Within);
        }
        else
        {
            Emit(first, last, 8, OutsideText, found.Outside);
        }
    }

    /// <summary>The signal of point i, which completes <paramref name="count"/> of the last m points beyond the zone on its side.</summary>
    private static void KOfMSignal(ReadOnlySpan<double> z, int i, int m, double zone, int count, string text, List<RunRuleSignal> signals)
    {
        var side = z[i] > 0 ? 1 : -1;
        var points = new int[count];
        var n = 0;
        for (var j = Math.Max(0, i - m + 1); j <= i; j++)
        {
            if (side * z[j] > zone)
            {
                points[n++] = j;
            }
        }

        signals.Add(new RunRuleSignal(default, 0, i, points, text));
    }

    /// <summary>1 for true, 0 for false, without a branch.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int Flag(bool value) => Unsafe.As<bool, byte>(ref value);

    /// <summary><paramref name="whenTrue"/> or <paramref name="otherwise"/>, without a branch.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int Choose(bool condition, int whenTrue, int otherwise)
    {
        var mask = -Flag(condition);
        return (whenTrue & mask) | (otherwise & ~mask);
    }

    /// <summary>The sign of a finite number (the points are checked finite first), without Math.Sign's NaN check.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
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
