using CsCheck;
using LineTest.Core.Stability;
using MathNet.Numerics;

namespace LineTest.Core.Tests.Stability;

public sealed class StabilityWindowTests
{
    // The demo sequence's source settings: ±0.05 °C over 60 s, drift below 0.02 °C/min, a reading every 5 s.
    private const double WindowSeconds = 60;
    private const double BandC = 0.05;
    private const double MaxDriftCPerMinute = 0.02;
    private const double IntervalSeconds = 5;

    public static TheoryData<double, double, double> BadSettings => new()
    {
        { 0, BandC, MaxDriftCPerMinute },
        { -1, BandC, MaxDriftCPerMinute },
        { WindowSeconds, 0, MaxDriftCPerMinute },
        { WindowSeconds, BandC, 0 },
        { WindowSeconds, BandC, -0.01 },
    };

    [Theory]
    [MemberData(nameof(BadSettings))]
    public void Constructor_NonPositiveSetting_Throws(double window, double band, double drift)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new StabilityWindow(window, band, drift));
    }

    [Fact]
    public void Evaluate_FewerThanThreeReadings_IsNotStable()
    {
        var window = NewWindow();
        window.Add(0, 20);
        window.Add(60, 20);

        var verdict = window.Evaluate();

        Assert.False(verdict.IsStable);
        Assert.Equal("not enough readings yet", verdict.Why);
        Assert.Null(verdict.Mean);
    }

    [Fact]
    public void Evaluate_ConstantSignal_BecomesStableExactlyWhenReadingsSpanTheWindow()
    {
        var window = NewWindow();
        for (var t = 0.0; t < WindowSeconds; t += IntervalSeconds)
        {
            window.Add(t, -20.0);
            var early = window.Evaluate();
            Assert.False(early.IsStable);
            Assert.Contains(early.Why, new[] { "not enough readings yet", "window not yet full" });
        }

        window.Add(WindowSeconds, -20.0);
        var verdict = window.Evaluate();

        Assert.True(verdict.IsStable);
        Assert.Equal("stable", verdict.Why);
        Assert.Equal(-20.0, verdict.Mean);
        Assert.Equal(0.0, verdict.DriftPerMinute);
        Assert.Equal(0.0, verdict.MaxDeviation);
        Assert.Equal(13, window.Count);
    }

    [Fact]
    public void Evaluate_RampFasterThanTheDriftLimit_IsStillDrifting()
    {
        // 0.05 °C/min over 60 s spans 0.05 °C: within ±0.05 of the mean, so only the slope can fail it.
        var window = Fill(NewWindow(), 0, WindowSeconds, t => 40 + 0.05 * t / 60);

        var verdict = window.Evaluate();

        Assert.False(verdict.IsStable);
        Assert.Equal("still drifting", verdict.Why);
        Assert.Equal(0.05, verdict.DriftPerMinute!.Value, 12);
        Assert.True(verdict.MaxDeviation <= BandC);
    }

    [Fact]
    public void Evaluate_FallingRampFasterThanTheLimit_IsStillDrifting()
    {
        var window = Fill(NewWindow(), 0, WindowSeconds, t => 40 - 0.03 * t / 60);

        var verdict = window.Evaluate();

        Assert.Equal("still drifting", verdict.Why);
        Assert.Equal(-0.03, verdict.DriftPerMinute!.Value, 12);
    }

    [Fact]
    public void Evaluate_RampSlowerThanTheLimit_IsStable()
    {
        var window = Fill(NewWindow(), 0, WindowSeconds, t => 40 + 0.015 * t / 60);

        var verdict = window.Evaluate();

        Assert.True(verdict.IsStable);
        Assert.Equal(0.015, verdict.DriftPerMinute!.Value, 12);
    }

    [Fact]
    public void Evaluate_SpikeOutsideTheBand_IsReadingsOutsideTheBand()
    {
        var window = Fill(NewWindow(), 0, WindowSeconds, t => t == 30 ? 5.2 : 5.0);

        var verdict = window.Evaluate();

        Assert.False(verdict.IsStable);
        Assert.Equal("readings outside the band", verdict.Why);

        // 13 readings, one of them 0.2 high: mean 5 + 0.2/13, largest deviation 0.2 − 0.2/13 (by hand).
        Assert.Equal(5 + (0.2 / 13), verdict.Mean!.Value, 12);
        Assert.Equal(0.2 - (0.2 / 13), verdict.MaxDeviation!.Value, 12);
    }

    [Fact]
    public void Add_ReadingsOlderThanTheWindow_LeaveIt()
    {
        var window = NewWindow();
        Fill(window, 0, 30, t => t == 10 ? 9.0 : 5.0);
        Assert.Equal("readings outside the band", Fill(window, 35, 65, _ => 5.0).Evaluate().Why);

        // At 75 s the window reaches back to 15 s: the spike at 10 s is gone.
        Fill(window, 70, 75, _ => 5.0);
        var verdict = window.Evaluate();

        Assert.True(verdict.IsStable);
        Assert.Equal(13, window.Count);
        Assert.Equal(0.0, verdict.MaxDeviation);
    }

    [Fact]
    public void Add_LongRun_KeepsOnlyTheWindow()
    {
        var window = Fill(NewWindow(), 0, 3600, _ => 23.0);

        Assert.Equal(13, window.Count);
    }

    [Fact]
    public void Add_OutOfOrder_Throws()
    {
        var window = NewWindow();
        window.Add(10, 1);

        Assert.Throws<ArgumentOutOfRangeException>(() => window.Add(9.999, 1));
        Assert.Equal(1, window.Count);
    }

    [Fact]
    public void Add_SameTimeTwice_IsAccepted()
    {
        var window = NewWindow();
        window.Add(10, 1);
        window.Add(10, 1.01);

        Assert.Equal(2, window.Count);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Add_NonFiniteTime_Throws(double seconds)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => NewWindow().Add(seconds, 1));
    }

    [Fact]
    public void Clear_ForgetsReadingsAndTheirTimes()
    {
        var window = Fill(NewWindow(), 0, 100, _ => 1.0);

        window.Clear();
        window.Add(0, 2.0);

        Assert.Equal(1, window.Count);
    }

    [Fact]
    public void Evaluate_UnevenReadingTimes_BecomesStableOnceTheWindowIsCovered()
    {
        // Regression: readings whose times do not fall on exact multiples of the window (a meter whose reads take
        // a little longer now and then) never spanned the window, because the reading at exactly t − window was
        // never there; a steady source then timed out. Times: 5 s apart plus 0 … 1.2 s of read time.
        var window = NewWindow();
        var times = Enumerable.Range(0, 40).Select(ReadAt).ToArray();
        double? stableAt = null;
        foreach (var t in times)
        {
            window.Add(t, 30.0);
            if (stableAt is null && window.Evaluate().IsStable)
            {
                stableAt = t;
            }
        }

        // The first reading at least 60 s after the first one (at 0 s) is k = 12, at 60.6 s.
        Assert.Equal(ReadAt(12), stableAt);
        Assert.True(window.Evaluate().IsStable);

        static double ReadAt(int k) => (IntervalSeconds * k) + (0.3 * (k % 5));
    }

    [Fact]
    public void Evaluate_IntervalThatDoesNotDivideTheWindow_StillBecomesStable()
    {
        // Regression: with a 10 s window read every 3 s, the readings kept spanned only 9 s and never filled it.
        var window = new StabilityWindow(10, BandC, MaxDriftCPerMinute);
        var verdicts = new List<(double T, bool Stable)>();
        for (var t = 0.0; t <= 30; t += 3)
        {
            window.Add(t, 1.0);
            verdicts.Add((t, window.Evaluate().IsStable));
        }

        Assert.Equal(12.0, verdicts.First(v => v.Stable).T);
        Assert.All(verdicts.Where(v => v.T >= 12), v => Assert.True(v.Stable));
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NegativeInfinity)]
    public void Evaluate_NonFiniteReading_IsNeverStable(double bad)
    {
        // Regression: a NaN made every comparison false, and the window answered "stable".
        var window = Fill(NewWindow(), 0, WindowSeconds, t => t == 30 ? bad : 20.0);

        var verdict = window.Evaluate();

        Assert.False(verdict.IsStable);
        Assert.Equal("a reading is not a finite number", verdict.Why);

        // Once it has left the window, the window judges the good readings again.
        Fill(window, 65, 95, _ => 20.0);
        Assert.True(window.Evaluate().IsStable);
    }

    [Fact]
    public void Evaluate_NonFiniteReadingWithUnlimitedBand_IsNeverStable()
    {
        // The soak uses an unlimited band and judges the drift only.
        var window = new StabilityWindow(30, double.PositiveInfinity, 0.05);
        Fill(window, 0, 30, t => t == 15 ? double.NaN : 0.5);

        Assert.False(window.Evaluate().IsStable);
    }

    [Fact]
    public void Evaluate_UnlimitedBand_JudgesTheDriftOnly()
    {
        var window = new StabilityWindow(30, double.PositiveInfinity, 0.05);
        Fill(window, 0, 30, t => t == 15 ? 100 : 0.5);

        Assert.True(window.Evaluate().IsStable);
    }

    [Fact]
    public void Evaluate_Slope_MatchesMathNetLeastSquaresLine()
    {
        // Independent reference: MathNet.Numerics Fit.Line (ordinary least squares) on the same points.
        var gen = Gen.Select(Gen.Double[-0.5, 0.5].Array[3, 40], Gen.Double[-100, 100], Gen.Double[-1, 1]);
        gen.Sample((noise, offset, slopePerSecond) =>
        {
            // Times strictly increasing from 0 to exactly the window, so every reading stays in it.
            var n = noise.Length;
            var times = Enumerable.Range(0, n).Select(i => WindowSeconds * i / (n - 1)).ToArray();
            var values = times.Select((t, i) => offset + (slopePerSecond * t) + noise[i]).ToArray();
            var window = new StabilityWindow(WindowSeconds, 1e6, 1e6);
            for (var i = 0; i < n; i++)
            {
                window.Add(times[i], values[i]);
            }

            var verdict = window.Evaluate();
            var (_, slope) = Fit.Line(times, values);

            Assert.Equal(n, window.Count);
            Assert.Equal(slope * 60, verdict.DriftPerMinute!.Value, 1e-9 * Math.Max(1, Math.Abs(slope * 60)));
            Assert.Equal(values.Average(), verdict.Mean!.Value, 1e-9 * Math.Max(1, Math.Abs(offset)));
            Assert.Equal(values.Max(v => Math.Abs(v - values.Average())), verdict.MaxDeviation!.Value, 1e-9 * Math.Max(1, Math.Abs(offset)));
        });
    }

    private static StabilityWindow NewWindow() => new(WindowSeconds, BandC, MaxDriftCPerMinute);

    /// <summary>Adds a reading every <see cref="IntervalSeconds"/> from <paramref name="from"/> to <paramref name="to"/> inclusive.</summary>
    private static StabilityWindow Fill(StabilityWindow window, double from, double to, Func<double, double> valueAt)
    {
        for (var t = from; t <= to + 1e-9; t += IntervalSeconds)
        {
            window.Add(t, valueAt(t));
        }

        return window;
    }
}
