namespace LineTest.Core.Scanning;

/// <summary>What the stored results say about a serial.</summary>
/// <param name="PreviousRuns">Runs of this serial stored before.</param>
/// <param name="PassedToday">Whether one of today's runs passed.</param>
public sealed record SerialHistory(int PreviousRuns, bool PassedToday)
{
    /// <summary>A serial never seen before.</summary>
    public static SerialHistory None { get; } = new(0, false);
}
