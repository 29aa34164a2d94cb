namespace LineTest.Core.Calibration;

/// <summary>A minimax straight line y ≈ Intercept + Slope·x (see <see cref="MinimaxLine"/>).</summary>
/// <param name="Intercept">a.</param>
/// <param name="Slope">b.</param>
/// <param name="MaxAbsError">The largest |y − (a + b·x)| over the samples.</param>
/// <param name="ReferenceX">The three points where the error alternates at its largest, in increasing x.</param>
/// <param name="ReferenceErrors">The error y − (a + b·x) at those points: equal magnitudes, alternating signs.</param>
public sealed record MinimaxLineResult(double Intercept, double Slope, double MaxAbsError, IReadOnlyList<double> ReferenceX, IReadOnlyList<double> ReferenceErrors);
