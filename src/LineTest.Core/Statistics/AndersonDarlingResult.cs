namespace LineTest.Core.Statistics;

/// <summary>
/// Anderson–Darling test of normality with the mean and σ estimated from the sample
/// (D'Agostino &amp; Stephens, Goodness-of-Fit Techniques, 1986, case 3).
/// </summary>
/// <param name="Count">Number of values.</param>
/// <param name="ASquared">The statistic A².</param>
/// <param name="AStarSquared">A*² = A²·(1 + 0.75/n + 2.25/n²), the form their p-value formulas take.</param>
/// <param name="PValue">Approximate p-value; small values are evidence against normality.</param>
public sealed record AndersonDarlingResult(int Count, double ASquared, double AStarSquared, double PValue);
