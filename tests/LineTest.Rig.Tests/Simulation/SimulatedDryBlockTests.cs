using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedDryBlockTests
{
    private const double RampUpCPerSecond = 10.0 / 60;
    private const double RampDownCPerSecond = 6.0 / 60;
    private const double TauSeconds = 30;

    private static (SimulatedDryBlock Block, VirtualTimeProvider Clock) NewBlock(double noiseC = 0)
    {
        var clock = SimulatedFixtures.Clock();
        var block = new SimulatedDryBlock(SimulatedFixtures.Source(), SimulatedFixtures.Simulation(blockNoiseC: noiseC), clock, seed: 3);
        return (block, clock);
    }

    [Fact]
    public async Task ReadTemperature_NewBlock_IsAtStandby()
    {
        var (block, _) = NewBlock();

        Assert.Equal(23.0, await block.ReadTemperatureAsync(CancellationToken.None));
        Assert.Equal(23.0, block.SetpointC);
    }

    [Fact]
    public async Task SetSetpoint_LargeStepUp_RampsAtUpLimit()
    {
        var (block, clock) = NewBlock();

        await block.SetSetpointAsync(100, CancellationToken.None);
        clock.Advance(TimeSpan.FromSeconds(120));

        // 23 °C + 10 °C/min × 2 min; the knee (|error| = rate·τ = 5 °C) is still far away.
        Assert.Equal(43.0, block.TrueTemperatureC(), 9);
    }

    [Fact]
    public async Task SetSetpoint_AnyCourse_NeverExceedsRampLimits()
    {
        var (block, clock) = NewBlock();
        var start = clock.GetUtcNow();
        await block.SetSetpointAsync(120, CancellationToken.None);
        clock.Advance(TimeSpan.FromMinutes(20));
        await block.SetSetpointAsync(-20, CancellationToken.None);
        clock.Advance(TimeSpan.FromMinutes(40));
        await block.SetSetpointAsync(0, CancellationToken.None);

        var step = TimeSpan.FromSeconds(1);
        var previous = block.TrueTemperatureAt(start);
        for (var t = start + step; t < start + TimeSpan.FromMinutes(70); t += step)
        {
            var current = block.TrueTemperatureAt(t);
            var rate = current - previous;
            Assert.InRange(rate, -RampDownCPerSecond - 1e-9, RampUpCPerSecond + 1e-9);
            previous = current;
        }
    }

    [Fact]
    public async Task SetSetpoint_AfterRamp_ErrorFallsTo1OverEInOneTimeConstant()
    {
        var (block, clock) = NewBlock();
        await block.SetSetpointAsync(80, CancellationToken.None);
        var knee = block.RampEndTime();

        var errorAtKnee = 80 - block.TrueTemperatureAt(knee);
        var errorOneTauLater = 80 - block.TrueTemperatureAt(knee + TimeSpan.FromSeconds(TauSeconds));

        // First-order system: e(t + τ) = e(t)/e.
        Assert.Equal(RampUpCPerSecond * TauSeconds, errorAtKnee, 9);
        Assert.Equal(errorAtKnee / Math.E, errorOneTauLater, 9);
    }

    [Theory]
    [InlineData(23, 100, 0.01)]
    [InlineData(23, 90, 0.1)]
    [InlineData(23, -20, 0.05)]
    [InlineData(23, 25, 0.01)]
    public async Task SetSetpoint_TimeToBand_MatchesRampTimePlusTauLnStepOverBand(double fromC, double toC, double bandC)
    {
        var (block, clock) = NewBlock();
        Assert.Equal(fromC, block.TrueTemperatureC());
        var start = clock.GetUtcNow();
        await block.SetSetpointAsync(toC, CancellationToken.None);

        // Rate-limited first-order model: ramp until |error| = r·τ, then e^(−t/τ) from there (from the whole step when it is smaller).
        var rate = toC > fromC ? RampUpCPerSecond : RampDownCPerSecond;
        var step = Math.Abs(toC - fromC);
        var knee = Math.Min(step, rate * TauSeconds);
        var expected = ((step - knee) / rate) + (TauSeconds * Math.Log(knee / bandC));

        var measured = FirstTimeWithin(block, start, toC, bandC);

        Assert.Equal(expected, measured, 0.05);
    }

    [Fact]
    public async Task SetSetpoint_MidRamp_NewCourseStartsFromCurrentTemperature()
    {
        var (block, clock) = NewBlock();
        await block.SetSetpointAsync(100, CancellationToken.None);
        clock.Advance(TimeSpan.FromMinutes(3));
        var reached = block.TrueTemperatureC();

        await block.SetSetpointAsync(0, CancellationToken.None);
        var justAfter = block.TrueTemperatureAt(clock.GetUtcNow() + TimeSpan.FromMilliseconds(1));

        Assert.Equal(53.0, reached, 9);
        Assert.Equal(reached, justAfter, 3);
        clock.Advance(TimeSpan.FromMinutes(1));
        Assert.Equal(53.0 - 6.0, block.TrueTemperatureC(), 9);
    }

    [Fact]
    public async Task ReadTemperature_NearSetpoint_CarriesBlockNoise()
    {
        var (block, clock) = NewBlock(noiseC: 0.002);
        await block.SetSetpointAsync(40, CancellationToken.None);
        clock.Advance(TimeSpan.FromHours(1));

        var readings = new double[4000];
        for (var i = 0; i < readings.Length; i++)
        {
            readings[i] = await block.ReadTemperatureAsync(CancellationToken.None);
        }

        var mean = readings.Average();
        var sd = Math.Sqrt(readings.Sum(r => (r - mean) * (r - mean)) / (readings.Length - 1));
        Assert.Equal(40.0, mean, 0.0005);
        Assert.InRange(sd, 0.0018, 0.0022);
    }

    [Fact]
    public async Task ReadTemperature_DuringRamp_HasNoNoise()
    {
        var (block, clock) = NewBlock(noiseC: 0.002);
        await block.SetSetpointAsync(100, CancellationToken.None);
        clock.Advance(TimeSpan.FromMinutes(1));

        Assert.Equal(block.TrueTemperatureC(), await block.ReadTemperatureAsync(CancellationToken.None));
    }

    [Fact]
    public async Task GoToStandby_AfterSetpoint_ControlsToStandby()
    {
        var (block, clock) = NewBlock();
        await block.SetSetpointAsync(60, CancellationToken.None);
        clock.Advance(TimeSpan.FromMinutes(30));

        await block.GoToStandbyAsync(CancellationToken.None);
        clock.Advance(TimeSpan.FromMinutes(30));
        var status = await block.ReadStatusAsync(CancellationToken.None);

        Assert.Equal(23.0, status.SetpointC);
        Assert.Equal(23.0, status.ActualC, 6);
        Assert.Null(status.Fault);
    }

    [Fact]
    public void SlotOffsetC_FromSimulation_PerSlotAndZeroBeyondList()
    {
        var (block, _) = NewBlock();

        Assert.Equal(0.01, block.SlotOffsetC(1));
        Assert.Equal(-0.02, block.SlotOffsetC(2));
        Assert.Equal(0.0, block.SlotOffsetC(9));
    }

    [Fact]
    public async Task SetSetpointAsync_Cancelled_ReturnsCancelledTaskAndKeepsSetpoint()
    {
        var (block, _) = NewBlock();

        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => block.SetSetpointAsync(50, new CancellationToken(canceled: true)));
        Assert.Equal(23.0, block.SetpointC);
    }

    [Fact]
    public void Constructor_ZeroTimeConstant_ThrowsNamingTheField()
    {
        var source = SimulatedFixtures.Source() with { SettlingTimeConstantSeconds = 0 };

        var error = Assert.Throws<ArgumentOutOfRangeException>(() => new SimulatedDryBlock(source, SimulatedFixtures.Simulation(), SimulatedFixtures.Clock(), 1));
        Assert.Contains("settlingTimeConstantSeconds", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Follow_AcrossRampAndApproach_MatchesNumericIntegration()
    {
        var (block, clock) = NewBlock();
        var start = clock.GetUtcNow();
        await block.SetSetpointAsync(70, CancellationToken.None);
        clock.Advance(TimeSpan.FromMinutes(7));
        await block.SetSetpointAsync(10, CancellationToken.None);
        var end = start + TimeSpan.FromMinutes(25);

        foreach (var tau in new[] { 12.0, TauSeconds, 55.0 })
        {
            var exact = block.Follow(23, start - TimeSpan.FromSeconds(30), end, tau);
            var numeric = IntegrateRk4(block, 23, start - TimeSpan.FromSeconds(30), end, tau);
            Assert.Equal(numeric, exact, 6);
        }
    }

    // Independent check: classical 4th-order Runge–Kutta on dy/dt = (x(t) − y)/τ with a 0.05 s step.
    private static double IntegrateRk4(SimulatedDryBlock block, double y, DateTimeOffset from, DateTimeOffset to, double tau)
    {
        const double h = 0.05;
        var total = (to - from).TotalSeconds;
        var steps = (int)Math.Round(total / h);
        double X(double s) => block.TrueTemperatureAt(from + TimeSpan.FromSeconds(s));
        for (var i = 0; i < steps; i++)
        {
            var s = i * h;
            var k1 = (X(s) - y) / tau;
            var k2 = (X(s + (h / 2)) - (y + (h / 2 * k1))) / tau;
            var k3 = (X(s + (h / 2)) - (y + (h / 2 * k2))) / tau;
            var k4 = (X(s + h) - (y + (h * k3))) / tau;
            y += h / 6 * (k1 + (2 * k2) + (2 * k3) + k4);
        }

        return y;
    }

    // Seconds after `start` when |setpoint − T| first falls to `bandC` (bisection on the monotone course).
    private static double FirstTimeWithin(SimulatedDryBlock block, DateTimeOffset start, double setpointC, double bandC)
    {
        double low = 0, high = 100_000;
        for (var i = 0; i < 100; i++)
        {
            var mid = (low + high) / 2;
            if (Math.Abs(setpointC - block.TrueTemperatureAt(start + TimeSpan.FromSeconds(mid))) <= bandC)
            {
                high = mid;
            }
            else
            {
                low = mid;
            }
        }

        return high;
    }
}
