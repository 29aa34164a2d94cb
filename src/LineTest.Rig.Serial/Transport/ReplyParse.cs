namespace LineTest.Rig.Serial.Transport;

/// <summary>
/// What a protocol made of one reply line: a value, a reply it could not understand, or an error the instrument
/// reported. Expected failures are values here; <see cref="SerialLine"/> turns them into retries or faults.
/// </summary>
/// <typeparam name="T">The value a good reply carries.</typeparam>
public sealed class ReplyParse<T>
{
    private ReplyParse(T? value, string? garbage, string? instrumentError)
    {
        Value = value;
        Garbage = garbage;
        InstrumentError = instrumentError;
    }

    /// <summary>The value of a good reply.</summary>
    public T? Value { get; }

    /// <summary>Why the reply could not be understood, or null.</summary>
    public string? Garbage { get; }

    /// <summary>The error text the instrument reported, or null.</summary>
    public string? InstrumentError { get; }

    /// <summary>True for a good reply.</summary>
    public bool IsOk => Garbage is null && InstrumentError is null;

    /// <summary>A good reply.</summary>
    public static ReplyParse<T> Ok(T value) => new(value, null, null);

    /// <summary>A reply that makes no sense for the command (framing, checksum, not a number).</summary>
    public static ReplyParse<T> NotUnderstood(string why) => new(default, why, null);

    /// <summary>The instrument answered with an error of its own.</summary>
    public static ReplyParse<T> Error(string text) => new(default, null, text);
}
