using System.Diagnostics.CodeAnalysis;

namespace LineTest.Core.Thermometry;

/// <summary>
/// The outcome of building a reference sensor from its definition: the sensor, or every problem found,
/// each a plain sentence that starts with the field it concerns (e.g. "r0: must be a positive …").
/// </summary>
public sealed class ReferenceSensorResult
{
    private ReferenceSensorResult(IReferenceSensor? sensor, IReadOnlyList<string> errors)
    {
        Sensor = sensor;
        Errors = errors;
    }

    /// <summary>The sensor; null on failure.</summary>
    public IReferenceSensor? Sensor { get; }

    /// <summary>The problems found; empty on success.</summary>
    public IReadOnlyList<string> Errors { get; }

    /// <summary>True when <see cref="Sensor"/> is set.</summary>
    [MemberNotNullWhen(true, nameof(Sensor))]
    public bool IsSuccess => Sensor is not null;

    /// <summary>A successful result.</summary>
    public static ReferenceSensorResult Success(IReferenceSensor sensor)
    {
        ArgumentNullException.ThrowIfNull(sensor);
        return new ReferenceSensorResult(sensor, []);
    }

    /// <summary>A failed result with at least one message.</summary>
    public static ReferenceSensorResult Failure(IEnumerable<string> errors)
    {
        ArgumentNullException.ThrowIfNull(errors);
        var list = errors.ToArray();
        if (list.Length == 0)
        {
            throw new ArgumentException("A failure needs at least one message.", nameof(errors));
        }

        return new ReferenceSensorResult(null, list);
    }
}
