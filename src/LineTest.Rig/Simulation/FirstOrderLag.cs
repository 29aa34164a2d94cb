namespace LineTest.Rig.Simulation;

/// <summary>
/// Exact solutions of a first-order lag <c>dy/dt = (x(t) − y)/τ</c> for the two input shapes the simulated block
/// produces, so that a follower can be advanced over any span of virtual time in one step.
/// </summary>
internal static class FirstOrderLag
{
    /// <summary>
    /// Input <c>x(t) = x0 + slope·t</c> over <paramref name="seconds"/>:
    /// <c>y(h) = x(h) − slope·τ + (y0 − x0 + slope·τ)·e^(−h/τ)</c>.
    /// </summary>
    public static double FollowLinear(double y0, double x0, double slopePerSecond, double seconds, double tau)
    {
        if (seconds <= 0)
        {
            return y0;
        }

        var decay = Math.Exp(-seconds / tau);
        return x0 + (slopePerSecond * seconds) - (slopePerSecond * tau) + ((y0 - x0 + (slopePerSecond * tau)) * decay);
    }

    /// <summary>
    /// Input <c>x(t) = S − e0·e^(−t/τx)</c> over <paramref name="seconds"/>. With <c>z = y − S</c>:
    /// <c>z(h) = K·e^(−h/τx) + (z0 − K)·e^(−h/τ)</c>, <c>K = −e0·τx/(τx − τ)</c>; when τx = τ the limit
    /// <c>z(h) = (z0 − e0·h/τ)·e^(−h/τ)</c> applies.
    /// </summary>
    public static double FollowExponential(double y0, double setpoint, double error0, double tauInput, double seconds, double tau)
    {
        if (seconds <= 0)
        {
            return y0;
        }

        var z0 = y0 - setpoint;
        var decayFollower = Math.Exp(-seconds / tau);

        // K·(e^(−h/τx) − e^(−h/τ)) = −e0·(h/τ)·ψ, with ψ = (e^(−h/τx) − e^(−h/τ))/z and z = h·(1/τ − 1/τx).
        // For small |z| the series e^(−h/τ)·(1 + z/2 + z²/6) avoids the cancellation, and gives the τx = τ limit.
        var z = seconds * ((1 / tau) - (1 / tauInput));
        var psi = Math.Abs(z) < 1e-4
            ? decayFollower * (1 + (z / 2) + (z * z / 6))
            : (Math.Exp(-seconds / tauInput) - decayFollower) / z;
        return setpoint + (z0 * decayFollower) - (error0 * seconds / tau * psi);
    }
}
