namespace LineTest.Core.Statistics;

/// <summary>
/// A statistic that was computed, or the plain reason it could not be (too few values, no variation...).
/// Not computable is an expected outcome for thin data, so it is a value rather than an exception.
/// </summary>
/// <typeparam name="T">The result type.</typeparam>
public sealed record StatisticOutcome<T>
    where T : class
{
    private StatisticOutcome(T? value, string? reason)
    {
        Value = value;
        Reason = reason;
    }

    /// <summary>The result; null when <see cref="Reason"/> says why not.</summary>
    public T? Value { get; }

    /// <summary>Why the statistic was not computed; null when it was.</summary>
    public string? Reason { get; }

    /// <summary>True when <see cref="Value"/> holds a result.</summary>
    public bool IsComputed => Value is not null;

    /// <summary>A computed result.</summary>
    public static StatisticOutcome<T> Computed(T value)
    {
        ArgumentNullException.ThrowIfNull(value);
        return new(value, null);
    }

    /// <summary>A result that could not be computed, with the reason.</summary>
    public static StatisticOutcome<T> NotComputed(string reason)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(reason);
        return new(null, reason);
    }
}
