using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Thermometry;

namespace LineTest.Station.Composition;

/// <summary>Builds the reference thermometer conversion a fixture declares.</summary>
public static class ReferenceConversion
{
    /// <summary>The sensor of <paramref name="fixture"/>; throws when the definition is unusable (the loader checks it first).</summary>
    public static IReferenceSensor SensorOf(FixtureDefinition fixture)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        var result = ReferenceSensorFactory.Create(fixture.Reference.Sensor);
        return result.Sensor ?? throw new InvalidOperationException(string.Join("; ", result.Errors));
    }

    /// <summary>Raw readout value to °C; NaN when the value is outside the sensor's range.</summary>
    public static Func<double, double> ToCelsius(IReferenceSensor sensor)
    {
        ArgumentNullException.ThrowIfNull(sensor);
        return raw => sensor.ToCelsius(raw) is { IsSuccess: true } r ? r.Value : double.NaN;
    }

    /// <summary>°C to the raw readout value (for the simulator's readout).</summary>
    public static Func<double, double> FromCelsius(IReferenceSensor sensor)
    {
        ArgumentNullException.ThrowIfNull(sensor);
        return celsius => sensor.FromCelsius(celsius) is { IsSuccess: true } r ? r.Value : double.NaN;
    }

    /// <summary>A fixture check that the reference sensor definition is usable, for <see cref="FixtureLoader"/>.</summary>
    public static void CheckSensor(FixtureDefinition fixture, ProblemList problems)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(problems);
        var result = ReferenceSensorFactory.Create(fixture.Reference.Sensor);
        foreach (var error in result.Errors)
        {
            problems.Add("$.reference.sensor", error);
        }
    }
}
