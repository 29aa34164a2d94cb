namespace LineTest.Core.Calibration;

/// <summary>
/// The outcome of a calculation that can fail for an expected reason (too few points, a sensor
/// with the wrong slope, a read-back mismatch): either a value or a plain-language reason.
/// Expected failures are values so that the station can record them as a reading; exceptions
/// remain for bugs.
/// </summary>
/// <typeparam name="T">The value computed on success.</typeparam>
public sealed class CalculationResult<T>
    where T : class
{
    private readonly T? _value;

    private CalculationResult(T? value, string? reason)
    {
        _value = value;
        Reason = reason;
    }

    /// <summary>True when a value was computed.</summary>
    public bool Succeeded => _value is not null;

    /// <summary>Why the calculation failed; null on success.</summary>
    public string? Reason { get; }

    /// <summary>The computed value. Throws when the calculation failed: check <see cref="Succeeded"/> first.</summary>
    public T Value => _value ?? throw new InvalidOperationException($"No value: {Reason}");

    /// <summary>A successful result.</summary>
    public static CalculationResult<T> Success(T value)
    {
        ArgumentNullException.ThrowIfNull(value);
        return new CalculationResult<T>(value, null);
    }

    /// <summary>A failed result with a plain-language reason.</summary>
    public static CalculationResult<T> Failure(string reason)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(reason);
        return new CalculationResult<T>(null, reason);
    }

    /// <summary>Gets the value when the calculation succeeded.</summary>
    public bool TryGetValue([System.Diagnostics.CodeAnalysis.NotNullWhen(true)] out T? value)
    {
        value = _value;
        return value is not null;
    }

    /// <summary>Passes a failure on unchanged, or applies the next step to the value.</summary>
    public CalculationResult<TNext> Then<TNext>(Func<T, CalculationResult<TNext>> next)
        where TNext : class
    {
        ArgumentNullException.ThrowIfNull(next);
        return _value is null ? CalculationResult<TNext>.Failure(Reason!) : next(_value);
    }

    /// <inheritdoc />
    public override string ToString() => _value is null ? $"failed: {Reason}" : $"ok: {_value}";
}
