namespace LineTest.Core.Sequences;

/// <summary>The words a sequence's <c>trim.fit</c> accepts: what a gain-and-offset trim makes zero or small.</summary>
public static class TrimFits
{
    /// <summary>The line through the calibration points (least squares with more than two): no error at the points.</summary>
    public const string ThroughPoints = "through-points";

    /// <summary>
    /// The line that makes the largest predicted error over the rated range smallest (Chebyshev equioscillation); needs
    /// the sequence's <c>ratedRange</c> and the trim's <c>sensorModel</c>.
    /// </summary>
    public const string Minimax = "minimax";

    /// <summary>Every accepted objective.</summary>
    public static IReadOnlyList<string> All { get; } = [ThroughPoints, Minimax];
}
