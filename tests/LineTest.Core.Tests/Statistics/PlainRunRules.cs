using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

/// <summary>
/// The run rules written one rule at a time, each a direct reading of its published wording (Western Electric
/// Statistical Quality Control Handbook, 1956, zone rules 1–4; Nelson, Journal of Quality Technology 16(4), 1984,
/// rules 1–8) with no work shared between rules: the reference that <see cref="RunRules"/>, which shares passes
/// between rules that look at the same points, must agree with signal for signal.
/// </summary>
internal static class PlainRunRules
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

        var signals = new List<RunRuleSignal>();
        const RunRuleFamily we = RunRuleFamily.WesternElectric;
        const RunRuleFamily ne = RunRuleFamily.Nelson;

        BeyondLimit(z, we, 1, signals);
        KOfM(z, 2, 3, 2.0, we, 2, "2 of 3 points beyond 2σ on the same side", signals);
        KOfM(z, 4, 5, 1.0, we, 3, "4 of 5 points beyond 1σ on the same side", signals);
        SameSide(z, 8, we, 4, "8 points in a row on one side of the centre line", signals);

        BeyondLimit(z, ne, 1, signals);
        SameSide(z, 9, ne, 2, "9 points in a row on one side of the centre line", signals);
        Trend(z, 6, ne, 3, "6 points in a row steadily rising or falling", signals);
        Alternating(z, 14, ne, 4, "14 points in a row alternating up and down", signals);
        KOfM(z, 2, 3, 2.0, ne, 5, "2 of 3 points beyond 2σ on the same side", signals);
        KOfM(z, 4, 5, 1.0, ne, 6, "4 of 5 points beyond 1σ on the same side", signals);
        Banded(z, 15, inside: true, ne, 7, "15 points in a row within 1σ of the centre line", signals);
        Banded(z, 8, inside: false, ne, 8, "8 points in a row beyond 1σ, either side", signals);
        return signals;
    }

    private static void BeyondLimit(double[] z, RunRuleFamily family, int rule, List<RunRuleSignal> signals)
    {
        for (var i = 0; i < z.Length; i++)
        {
            if (Math.Abs(z[i]) > 3)
            {
                signals.Add(new RunRuleSignal(family, rule, i, [i], "1 point beyond 3σ"));
            }
        }
    }

    private static void KOfM(double[] z, int k, int m, double zone, RunRuleFamily family, int rule, string text, List<RunRuleSignal> signals)
    {
        for (var i = 0; i < z.Length; i++)
        {
            var side = z[i] > zone ? 1 : z[i] < -zone ? -1 : 0;
            if (side == 0)
            {
                continue;
            }

            var first = Math.Max(0, i - m + 1);
            var count = 0;
            for (var j = first; j <= i; j++)
            {
                if (side * z[j] > zone)
                {
                    count++;
                }
            }

            if (count >= k)
            {
                var points = new List<int>(count);
                for (var j = first; j <= i; j++)
                {
                    if (side * z[j] > zone)
                    {
                        points.Add(j);
                    }
                }

                signals.Add(new RunRuleSignal(family, rule, i, points, text));
            }
        }
    }

    private static void SameSide(double[] z, int length, RunRuleFamily family, int rule, string text, List<RunRuleSignal> signals)
    {
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
                Emit(start, i - 1, length, family, rule, text, signals);
            }

            start = i;
        }
    }

    private static void Trend(double[] z, int length, RunRuleFamily family, int rule, string text, List<RunRuleSignal> signals)
    {
        // A run of points start…i in which every step has the same non-zero sign.
        var start = 0;
        var direction = 0;
        for (var i = 1; i <= z.Length; i++)
        {
            var step = i < z.Length ? Sign(z[i] - z[i - 1]) : 0;
            if (step != 0 && (direction == 0 || step == direction))
            {
                direction = step;
                continue;
            }

            Emit(start, i - 1, length, family, rule, text, signals);
            start = step == 0 ? i : i - 1;
            direction = step;
        }
    }

    private static void Alternating(double[] z, int length, RunRuleFamily family, int rule, string text, List<RunRuleSignal> signals)
    {
        // A run of points start…i whose successive steps are non-zero and change sign every time.
        var start = 0;
        var previous = 0;
        for (var i = 1; i <= z.Length; i++)
        {
            var step = i < z.Length ? Sign(z[i] - z[i - 1]) : 0;
            if (step != 0 && (previous == 0 || step == -previous))
            {
                previous = step;
                continue;
            }

            Emit(start, i - 1, length, family, rule, text, signals);
            start = step == 0 ? i : i - 1;
            previous = step;
        }
    }

    private static void Banded(double[] z, int length, bool inside, RunRuleFamily family, int rule, string text, List<RunRuleSignal> signals)
    {
        var start = -1;
        for (var i = 0; i <= z.Length; i++)
        {
            var member = i < z.Length && (inside ? Math.Abs(z[i]) < 1 : Math.Abs(z[i]) > 1);
            if (member)
            {
                if (start < 0)
                {
                    start = i;
                }

                continue;
            }

            if (start >= 0)
            {
                Emit(start, i - 1, length, family, rule, text, signals);
                start = -1;
            }
        }
    }

    /// <summary>The sign of a finite number (the points are checked finite first), without Math.Sign's NaN check.</summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static int Sign(double x) => x > 0 ? 1 : x < 0 ? -1 : 0;

    private static void Emit(int first, int last, int length, RunRuleFamily family, int rule, string text, List<RunRuleSignal> signals)
    {
        var count = last - first + 1;
        if (count < length)
        {
            return;
        }

        var points = new int[count];
        for (var j = 0; j < count; j++)
        {
            points[j] = first + j;
        }

        signals.Add(new RunRuleSignal(family, rule, first + length - 1, points, text));
    }
}
