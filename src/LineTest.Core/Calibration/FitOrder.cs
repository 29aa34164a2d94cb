namespace LineTest.Core.Calibration;

/// <summary>Order of the fitted polynomial; the value is the highest power.</summary>
public enum FitOrder
{
    /// <summary>Straight line c0 + c1·x: needs at least two distinct x.</summary>
    Linear = 1,

    /// <summary>Quadratic c0 + c1·x + c2·x²: needs at least three distinct x.</summary>
    Quadratic = 2,
}
