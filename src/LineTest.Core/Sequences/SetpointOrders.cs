namespace LineTest.Core.Sequences;

/// <summary>The words a sequence's <c>setpointOrder</c> accepts.</summary>
public static class SetpointOrders
{
    /// <summary>Setpoints are visited in the order of the steps (the default).</summary>
    public const string Fixed = "fixed";

    /// <summary>
    /// Contiguous settle blocks that do not depend on each other (a settle followed only by measure or verify steps at
    /// that setpoint, with no trim, prompt or other step between them) may be visited in any order; the station picks
    /// the order with the least source travel from where the block is when the batch starts.
    /// </summary>
    public const string Free = "free";

    /// <summary>Every accepted word.</summary>
    public static IReadOnlyList<string> All { get; } = [Fixed, Free];
}
