namespace LineTest.Factory.Forwarding;

/// <summary>What one forwarding pass did.</summary>
/// <param name="Stored">Runs the factory database stored now.</param>
/// <param name="Duplicates">Runs it already held with the same record hash (stored once, not again).</param>
/// <param name="Refused">Runs refused and raised as alarms.</param>
/// <param name="ThroughSeq">The station's highest seq the factory has now committed (0 when none).</param>
public sealed record ForwardResult(int Stored, int Duplicates, int Refused, long ThroughSeq)
{
    /// <summary>Nothing forwarded.</summary>
    public static ForwardResult None { get; } = new(0, 0, 0, 0);

    /// <summary>This pass and <paramref name="next"/> together.</summary>
    public ForwardResult Add(ForwardResult next)
    {
        ArgumentNullException.ThrowIfNull(next);
        return new ForwardResult(Stored + next.Stored, Duplicates + next.Duplicates, Refused + next.Refused, Math.Max(ThroughSeq, next.ThroughSeq));
    }
}
