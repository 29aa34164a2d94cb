using System.Diagnostics.CodeAnalysis;

namespace LineTest.Core.Thermometry;

/// <summary>
/// The outcome of one conversion between a sensor's raw reading and °C: either a value or a plain
/// message that says why there is none (for example the input lies outside the valid range).
/// Out-of-range input is an expected event on a station, so it is a value, not an exception.
/// </summary>
public readonly struct ConversionResult : IEquatable<ConversionResult>
{
    private readonly double _value;
    private readonly string? _error;
    private readonly bool _succeeded;

    private ConversionResult(double value, string? error, bool succeeded)
    {
        _value = value;
        _error = error;
        _succeeded = succeeded;
    }

    /// <summary>True when <see cref="Value"/> holds a result.</summary>
    [MemberNotNullWhen(false, nameof(Error))]
    public bool IsSuccess => _succeeded;

    /// <summary>The converted value; reading it from a failure is a bug and throws.</summary>
    public double Value => _succeeded
        ? _value
        : throw new InvalidOperationException($"The conversion failed and has no value: {Error}");

    /// <summary>Why the conversion failed; null on success.</summary>
    public string? Error => _succeeded ? null : _error ?? "no conversion was made";

    /// <summary>A successful result.</summary>
    public static ConversionResult Success(double value) => new(value, null, true);

    /// <summary>A failed result with a message that says where and why.</summary>
    public static ConversionResult Failure(string error)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(error);
        return new ConversionResult(double.NaN, error, false);
    }

    /// <summary>Gets the value when there is one.</summary>
    public bool TryGetValue(out double value)
    {
        value = _succeeded ? _value : double.NaN;
        return _succeeded;
    }

    /// <inheritdoc />
    public bool Equals(ConversionResult other) =>
        _succeeded == other._succeeded && _value.Equals(other._value) && string.Equals(Error, other.Error, StringComparison.Ordinal);

    /// <inheritdoc />
    public override bool Equals(object? obj) => obj is ConversionResult other && Equals(other);

    /// <inheritdoc />
    public override int GetHashCode() => HashCode.Combine(_succeeded, _value, Error);

    /// <inheritdoc />
    public override string ToString() =>
        _succeeded ? _value.ToString("R", System.Globalization.CultureInfo.InvariantCulture) : $"failure: {Error}";

    /// <summary>Value equality.</summary>
    public static bool operator ==(ConversionResult left, ConversionResult right) => left.Equals(right);

    /// <summary>Value inequality.</summary>
    public static bool operator !=(ConversionResult left, ConversionResult right) => !left.Equals(right);
}
