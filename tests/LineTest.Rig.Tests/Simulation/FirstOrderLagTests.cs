using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class FirstOrderLagTests
{
    [Fact]
    public void FollowLinear_StepInput_FallsTo1OverEInOneTimeConstant()
    {
        // Step response of a first-order lag: y(τ) = x + (y0 − x)/e.
        var y = FirstOrderLag.FollowLinear(y0: 23, x0: 50, slopePerSecond: 0, seconds: 40, tau: 40);

        Assert.Equal(50 - (27 / Math.E), y, 12);
    }

    [Fact]
    public void FollowLinear_LongRamp_LagsBySlopeTimesTau()
    {
        // Ramp response of a first-order lag: after the transient, y trails x by slope·τ.
        var y = FirstOrderLag.FollowLinear(y0: 0, x0: 0, slopePerSecond: 0.1, seconds: 10_000, tau: 20);

        Assert.Equal(1000 - 2, y, 9);
    }

    [Theory]
    [InlineData(30.0, 40.0)]
    [InlineData(40.0, 40.0)]
    [InlineData(40.0, 40.00001)]
    [InlineData(5.0, 80.0)]
    public void FollowExponential_AgainstNumericIntegration_Agrees(double tauInput, double tau)
    {
        const double setpoint = 50;
        const double error0 = 4;
        const double seconds = 200;
        var exact = FirstOrderLag.FollowExponential(10, setpoint, error0, tauInput, seconds, tau);

        // Independent check: classical RK4 on dy/dt = (S − e0·e^(−t/τx) − y)/τ.
        double X(double t) => setpoint - (error0 * Math.Exp(-t / tauInput));
        const double h = 0.01;
        var y = 10.0;
        for (var i = 0; i < seconds / h; i++)
        {
            var t = i * h;
            var k1 = (X(t) - y) / tau;
            var k2 = (X(t + (h / 2)) - (y + (h / 2 * k1))) / tau;
            var k3 = (X(t + (h / 2)) - (y + (h / 2 * k2))) / tau;
            var k4 = (X(t + h) - (y + (h * k3))) / tau;
            y += h / 6 * (k1 + (2 * k2) + (2 * k3) + k4);
        }

        Assert.Equal(y, exact, 7);
    }
}
