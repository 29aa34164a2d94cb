using System.Globalization;
using LineTest.Core.Decisions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Rig.Instruments;
using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Instruments;

/// <summary>
/// The only way steps reach the fixture's instruments: every call paced as the real instrument is
/// (<see cref="InstrumentTiming"/>) and every <see cref="InstrumentFaultException"/> translated into what it means for
/// the batch: a unit-link fault errors that unit only (<see cref="UnitFaultException"/>); a source, reference, meter
/// or source-measure unit fault stops the batch (<see cref="BatchFaultException"/>).
/// </summary>
/// <remarks>Used from the coordinator's one flow of control only.</remarks>
internal sealed class InstrumentGateway
{
    private readonly RigInstruments _rig;
    private readonly Func<double, double> _referenceToCelsius;
    private readonly TimeProvider _time;

    // The reference's last raw reading, for the slope of its conversion in the next budget; kept across batches.
    private double _lastReferenceRaw = double.NaN;

    public InstrumentGateway(RigInstruments rig, FixtureDefinition fixture, Func<double, double> referenceToCelsius, TimeProvider time, InstrumentTiming timing)
    {
        _rig = rig;
        Fixture = fixture;
        _referenceToCelsius = referenceToCelsius;
        _time = time;
        Timing = timing;
    }

    public FixtureDefinition Fixture { get; }

    public InstrumentTiming Timing { get; }

    public DateTimeOffset Now => _time.GetUtcNow();

    /// <summary>Whether the fixture's instruments include a source-measure unit.</summary>
    public bool HasSourceMeter => _rig.SourceMeter is not null;

    public Task DelayAsync(double seconds, CancellationToken ct) =>
        seconds <= 0 ? Task.CompletedTask : Task.Delay(TimeSpan.FromSeconds(seconds), _time, ct);

    public SlotDefinition SlotOf(int slot) => Fixture.Slots.First(s => s.Slot == slot);

    /// <summary>One reference reading, °C; a lost readout or a raw value no temperature can give stops the batch.</summary>
    public async Task<double> ReadReferenceAsync(CancellationToken ct)
    {
        await DelayAsync(Timing.ReferenceReadSeconds, ct).ConfigureAwait(false);
        double raw;
        try
        {
            raw = await _rig.Reference.ReadRawAsync(ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException ex)
        {
            throw new BatchFaultException($"reference thermometer lost: {ex.Message}", ex);
        }

        _lastReferenceRaw = raw;
        var celsius = _referenceToCelsius(raw);
        if (!double.IsFinite(celsius))
        {
            throw new BatchFaultException(
                $"the reference readout gave {F(raw)}, which is not a temperature the reference sensor can have: check the reference probe and its wiring");
        }

        return celsius;
    }

    /// <summary>The reference budget of <paramref name="references"/> (<see cref="StationBudgets.Reference"/>) at the last reading's slope.</summary>
    public UncertaintyBudget ReferenceBudget(double[] references) =>
        StationBudgets.Reference(Fixture.Reference, references, ReferenceCelsiusPerRaw());

    /// <summary>One meter reading on <paramref name="channel"/>, volts; a lost meter or a non-number stops the batch.</summary>
    public async Task<double> ReadMeterAsync(int channel, CancellationToken ct)
    {
        await DelayAsync(Timing.MeterReadSeconds, ct).ConfigureAwait(false);
        try
        {
            var volts = await _rig.Meter.ReadDcVoltsAsync(channel, ct).ConfigureAwait(false);
            if (!double.IsFinite(volts))
            {
                throw new BatchFaultException($"the meter returned a non-numeric reading on channel {channel}");
            }

            return volts;
        }
        catch (InstrumentFaultException ex)
        {
            throw new BatchFaultException($"voltmeter lost: {ex.Message}", ex);
        }
    }

    /// <summary>The source's own control temperature, °C; a lost source stops the batch.</summary>
    public async Task<double> ReadSourceTemperatureAsync(CancellationToken ct)
    {
        var celsius = 0.0;
        await SourceAsync(async token => celsius = await _rig.Source.ReadTemperatureAsync(token).ConfigureAwait(false), ct).ConfigureAwait(false);
        return celsius;
    }

    /// <summary>
    /// Commands <paramref name="setpoint"/> after the safe-range guard; returns when it was commanded. A setpoint outside
    /// the fixture's safe range is never sent.
    /// </summary>
    public async Task<DateTimeOffset> CommandSetpointAsync(SetpointDefinition setpoint, CancellationToken ct)
    {
        var source = Fixture.Source;
        if (setpoint.Celsius < source.SafeMinC || setpoint.Celsius > source.SafeMaxC)
        {
            // The checker refuses such sequences; this guard protects against a fixture swapped after the check.
            throw new BatchFaultException(
                $"setpoint '{setpoint.Name}' ({F(setpoint.Celsius)} °C) is outside the safe range of fixture '{Fixture.Id}' ({F(source.SafeMinC)} … {F(source.SafeMaxC)} °C); nothing was sent to the source");
        }

        var commanded = _time.GetUtcNow();
        await SourceAsync(token => _rig.Source.SetSetpointAsync(setpoint.Celsius, token), ct).ConfigureAwait(false);
        return commanded;
    }

    /// <summary>Sends the source to standby; faults are the caller's to log (standby must never throw past the coordinator).</summary>
    public Task GoToStandbyAsync(CancellationToken ct) => _rig.Source.GoToStandbyAsync(ct);

    /// <summary>One exchange over <paramref name="slot"/>'s unit link; any link fault is that unit's fault only.</summary>
    public async Task<T> LinkAsync<T>(int slot, Func<IUnitLink, CancellationToken, Task<T>> call, CancellationToken ct)
    {
        if (!_rig.UnitLinks.TryGetValue(slot, out var link))
        {
            throw new UnitFaultException($"slot {slot} has no unit link in fixture '{Fixture.Id}'");
        }

        await DelayAsync(Timing.UnitExchangeSeconds, ct).ConfigureAwait(false);
        try
        {
            return await call(link, ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException ex)
        {
            var what = ex.Kind switch
            {
                InstrumentFaultKind.NoAnswer => "the unit does not answer on its link",
                InstrumentFaultKind.GarbageReply => "the unit's reply could not be understood",
                InstrumentFaultKind.PortLost => "the unit's port was lost",
                InstrumentFaultKind.InstrumentError => "the unit reported an error",
                _ => "the unit link failed",
            };
            throw new UnitFaultException($"{what} (slot {slot}): {ex.Message}", ex);
        }
    }

    public Task LinkAsync(int slot, Func<IUnitLink, CancellationToken, Task> call, CancellationToken ct) =>
        LinkAsync<bool>(slot, async (link, token) =>
        {
            await call(link, token).ConfigureAwait(false);
            return true;
        }, ct);

    /// <summary>One reading of a unit's value: meter volts on its output channel, or raw counts or °C over its link.</summary>
    public async Task<double> ReadUnitAsync(int slot, UnitRead read, CancellationToken ct)
    {
        switch (read)
        {
            case UnitRead.Raw:
                return await LinkAsync(slot, (link, token) => link.ReadRawAsync(token), ct).ConfigureAwait(false);
            case UnitRead.Temperature:
                var celsius = await LinkAsync(slot, (link, token) => link.ReadTemperatureAsync(token), ct).ConfigureAwait(false);
                if (!double.IsFinite(celsius))
                {
                    throw new UnitFaultException($"the unit in slot {slot} reported a temperature that is not a number");
                }

                return celsius;
            default:
                return await ReadMeterAsync(SlotOf(slot).OutputChannel, ct).ConfigureAwait(false);
        }
    }

    /// <summary>One call to the source-measure unit (the caller checked <see cref="HasSourceMeter"/>); a lost SMU stops the batch.</summary>
    public async Task<T> SourceMeterAsync<T>(Func<ISourceMeter, CancellationToken, Task<T>> call, CancellationToken ct)
    {
        var smu = _rig.SourceMeter ?? throw new InvalidOperationException("The caller checks HasSourceMeter first.");
        try
        {
            return await call(smu, ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException ex)
        {
            throw new BatchFaultException($"source-measure unit lost: {ex.Message}", ex);
        }
    }

    public Task SourceMeterAsync(Func<ISourceMeter, CancellationToken, Task> call, CancellationToken ct) =>
        SourceMeterAsync<bool>(async (smu, token) =>
        {
            await call(smu, token).ConfigureAwait(false);
            return true;
        }, ct);

    private async Task SourceAsync(Func<CancellationToken, Task> call, CancellationToken ct)
    {
        try
        {
            await call(ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException ex)
        {
            throw new BatchFaultException($"temperature source lost: {ex.Message}", ex);
        }
    }

    /// <summary>°C per raw unit of the reference at its last reading (numerical derivative of the conversion).</summary>
    private double ReferenceCelsiusPerRaw()
    {
        var h = Math.Max(Fixture.Reference.ReadoutResolution, Math.Abs(_lastReferenceRaw) * 1e-6);
        var slope = (_referenceToCelsius(_lastReferenceRaw + h) - _referenceToCelsius(_lastReferenceRaw - h)) / (2 * h);
        return double.IsFinite(slope) ? slope : 0;
    }

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
