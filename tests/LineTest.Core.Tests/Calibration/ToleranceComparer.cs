namespace LineTest.Core.Tests.Calibration;

/// <summary>Compares doubles within an absolute tolerance, for whole-array assertions.</summary>
internal sealed class ToleranceComparer(double tolerance) : IEqualityComparer<double>
{
    public bool Equals(double x, double y) => Math.Abs(x - y) <= tolerance;

    public int GetHashCode(double obj) => 0;
}
