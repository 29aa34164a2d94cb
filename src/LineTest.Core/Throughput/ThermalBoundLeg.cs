namespace LineTest.Core.Throughput;

/// <summary>The bound for one setpoint: travel, the stability window, the soak and the measurements, in seconds.</summary>
public sealed record ThermalBoundLeg(string Setpoint, double Celsius, double TravelSeconds, double StableWindowSeconds, double SoakSeconds, double MeasureSeconds)
{
    /// <summary>All of it.</summary>
    public double TotalSeconds => TravelSeconds + StableWindowSeconds + SoakSeconds + MeasureSeconds;
}
