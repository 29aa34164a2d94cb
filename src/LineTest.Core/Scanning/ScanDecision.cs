namespace LineTest.Core.Scanning;

/// <summary>The answer to a scan.</summary>
/// <param name="Accepted">True when the unit may be loaded.</param>
/// <param name="Serial">The cleaned serial.</param>
/// <param name="IsRetest">True when the serial has run before (and did not pass today).</param>
/// <param name="Reason">Why it was refused, for the operator.</param>
public sealed record ScanDecision(bool Accepted, string Serial, bool IsRetest, string? Reason)
{
    /// <summary>An accepted scan.</summary>
    public static ScanDecision Accept(string serial, bool isRetest) => new(true, serial, isRetest, null);

    /// <summary>A refused scan.</summary>
    public static ScanDecision Refuse(string serial, string reason) => new(false, serial, false, reason);
}
