using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Meter;
using LineTest.Rig.Serial.Reference;
using LineTest.Rig.Serial.Source;
using LineTest.Rig.Serial.SourceMeter;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Serial.UnitLink;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Rigs;

/// <summary>
/// The instruments of a fixture with <c>rig: "serial"</c>, each a driver on its own serial port. Ports are opened on
/// first use, so building the rig never fails on a missing port; the first command says which port and why.
/// </summary>
public sealed class SerialRig : IDisposable
{
    private SerialRig(
        SerialTemperatureSource source, SerialReferenceReadout reference, ScpiVoltmeter meter, IReadOnlyDictionary<int, SerialUnitLink> unitLinks, ScpiSourceMeter? sourceMeter)
    {
        Source = source;
        Reference = reference;
        Meter = meter;
        UnitLinks = unitLinks;
        SourceMeter = sourceMeter;
        Instruments = new RigInstruments(source, reference, meter, unitLinks.ToDictionary(p => p.Key, p => (IUnitLink)p.Value), sourceMeter);
    }

    /// <summary>The source-measure unit, or null when the fixture has none.</summary>
    public ScpiSourceMeter? SourceMeter { get; }

    /// <summary>The temperature source.</summary>
    public SerialTemperatureSource Source { get; }

    /// <summary>The reference readout.</summary>
    public SerialReferenceReadout Reference { get; }

    /// <summary>The voltmeter.</summary>
    public ScpiVoltmeter Meter { get; }

    /// <summary>Each slot's unit link.</summary>
    public IReadOnlyDictionary<int, SerialUnitLink> UnitLinks { get; }

    /// <summary>The instruments as the runtime sees them.</summary>
    public RigInstruments Instruments { get; }

    /// <summary>Every problem that keeps <paramref name="fixture"/> from being driven over serial ports (empty when none).</summary>
    public static IReadOnlyList<string> Problems(FixtureDefinition fixture)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        var problems = new List<string>();
        if (fixture.Rig != "serial")
        {
            problems.Add($"fixture '{fixture.Id}' has rig '{fixture.Rig}', not 'serial'");
        }

        void Need(PortDefinition? port, string where)
        {
            if (port is null || string.IsNullOrWhiteSpace(port.Name))
            {
                problems.Add($"{where} has no serial port");
            }
        }

        Need(fixture.Source.Port, "$.source");
        Need(fixture.Reference.Port, "$.reference");
        Need(fixture.Meter.Port, "$.meter");
        if (fixture.SourceMeter is { } smu)
        {
            Need(smu.Port, "$.sourceMeter");
        }

        foreach (var slot in fixture.Slots)
        {
            Need(slot.UnitPort, $"slot {slot.Slot}");
        }

        if (!ReferenceCommands.UnitForKnown(fixture.Reference.Sensor.Kind))
        {
            problems.Add($"$.reference.sensor.kind '{fixture.Reference.Sensor.Kind}' has no readout unit");
        }

        return problems;
    }

    /// <summary>Builds the drivers of <paramref name="fixture"/>; no port is opened yet.</summary>
    /// <param name="fixture">A fixture with <c>rig: "serial"</c> and a port for every instrument and slot.</param>
    /// <param name="loggers">Loggers for the exchanges.</param>
    /// <param name="wallClock">Wall clock for reply timeouts; <see cref="TimeProvider.System"/> when null.</param>
    /// <exception cref="ArgumentException">The fixture cannot be driven over serial ports (every problem is listed).</exception>
    public static SerialRig Open(FixtureDefinition fixture, ILoggerFactory loggers, TimeProvider? wallClock = null)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(loggers);
        var problems = Problems(fixture);
        if (problems.Count > 0)
        {
            throw new ArgumentException($"Fixture '{fixture.Id}' cannot be driven over serial ports: {string.Join("; ", problems)}.", nameof(fixture));
        }

        var clock = wallClock ?? TimeProvider.System;
        var logger = loggers.CreateLogger<SerialRig>();
        SerialLine Line(string name, PortDefinition port, ILineFraming framing) => new(name, port, framing, logger, clock);
        return new SerialRig(
            new SerialTemperatureSource(fixture.Source, Line("source", fixture.Source.Port!, PlainFraming.Instance)),
            new SerialReferenceReadout(Line("reference", fixture.Reference.Port!, PlainFraming.Instance), ReferenceCommands.UnitFor(fixture.Reference.Sensor.Kind)),
            new ScpiVoltmeter(fixture.Meter, Line("meter", fixture.Meter.Port!, PlainFraming.Instance)),
            fixture.Slots.ToDictionary(s => s.Slot, s => new SerialUnitLink(Line($"unit slot {s.Slot}", s.UnitPort!, ChecksumFraming.Instance))),
            fixture.SourceMeter is { } smu ? new ScpiSourceMeter(smu, Line("source-measure unit", smu.Port!, PlainFraming.Instance)) : null);
    }

    /// <summary>Closes every port.</summary>
    public void Dispose()
    {
        Source.Line.Dispose();
        Reference.Line.Dispose();
        Meter.Line.Dispose();
        SourceMeter?.Line.Dispose();
        foreach (var link in UnitLinks.Values)
        {
            link.Line.Dispose();
        }
    }
}
