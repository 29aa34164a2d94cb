using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// A simulated source-measure unit with a channel scanner: each slot's <see cref="SlotDefinition.SmuChannel"/> reaches
/// its unit's sensing diode. At the commanded current it reads the diode's forward voltage at the sensor's present
/// temperature (<see cref="SiliconDiode.ForwardVolts"/>, with the part's I_s, n, R_s and any leakage) plus measurement
/// noise; an open sensor, an empty slot or a voltage above the compliance limit reads the limit, flagged in compliance.
/// </summary>
/// <remarks>Like the other simulated instruments it answers at once; the coordinator accounts the time.</remarks>
public sealed class SimulatedSourceMeter : ISourceMeter
{
    private const string InstrumentName = "source-measure unit";

    // Concurrency: everything below is guarded by _lock; a slot's unit by the slot's own lock (taken after _lock).
    private readonly Lock _lock = new();
    private readonly SourceMeterDefinition _definition;
    private readonly IReadOnlyDictionary<int, SimulatedSlot> _channels;
    private readonly Random _rng;
    private readonly FaultGate _faults = new();
    private int? _channel;
    private double _amps;
    private double _complianceVolts;
    private bool _outputOn;

    internal SimulatedSourceMeter(SourceMeterDefinition definition, IEnumerable<SimulatedSlot> slots, int seed)
    {
        ArgumentNullException.ThrowIfNull(definition);
        _definition = definition;
        _channels = slots.Where(s => s.Definition.SmuChannel is not null).ToDictionary(s => s.Definition.SmuChannel!.Value);
        _rng = new Random(seed);
    }

    /// <summary>Whether the output is on (a current flows).</summary>
    public bool OutputOn
    {
        get
        {
            lock (_lock)
            {
                return _outputOn;
            }
        }
    }

    /// <inheritdoc/>
    public Task SetCurrentAsync(int channel, double amps, double complianceVolts, CancellationToken cancellationToken)
        => SimulatedCall.Run(() => SetCurrent(channel, amps, complianceVolts), cancellationToken);

    /// <inheritdoc/>
    public Task<SourceMeterReading> MeasureVoltsAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(Measure, cancellationToken);

    /// <inheritdoc/>
    public Task OutputOffAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(
            () =>
            {
                lock (_lock)
                {
                    Gate();
                    _outputOn = false;
                }
            },
            cancellationToken);

    internal void ArmFault(RigFault fault)
    {
        lock (_lock)
        {
            _faults.Arm(fault);
        }
    }

    internal void ClearFaults()
    {
        lock (_lock)
        {
            _faults.Clear();
        }
    }

    private void SetCurrent(int channel, double amps, double complianceVolts)
    {
        lock (_lock)
        {
            Gate();
            if (!_channels.ContainsKey(channel))
            {
                throw new InstrumentFaultException(InstrumentName, InstrumentFaultKind.InstrumentError,
                    string.Create(CultureInfo.InvariantCulture, $"channel {channel} is not wired to a slot"));
            }

            if (!(amps > 0) || amps > _definition.MaxCurrentAmps || !(complianceVolts > 0))
            {
                throw new InstrumentFaultException(InstrumentName, InstrumentFaultKind.InstrumentError,
                    string.Create(CultureInfo.InvariantCulture, $"refused {amps} A with {complianceVolts} V compliance (limit {_definition.MaxCurrentAmps} A)"));
            }

            _channel = channel;
            _amps = amps;
            _complianceVolts = complianceVolts;
            _outputOn = true;
        }
    }

    private SourceMeterReading Measure()
    {
        lock (_lock)
        {
            Gate();
            if (!_outputOn || _channel is not { } channel)
            {
                return new SourceMeterReading(_rng.NextNormal(0, _definition.NoiseVolts), false);
            }

            double? volts = null;
            var slot = _channels[channel];
            lock (slot.Gate)
            {
                if (slot.CurrentUnitLocked() is { } unit && unit.Defect != UnitDefect.OpenSensor)
                {
                    volts = unit.Parameters.Diode.ForwardVolts(unit.SensorC, _amps);
                }
            }

            // Open circuit: the source raises its voltage to the limit and cannot force the current.
            if (volts is not { } v || v > _complianceVolts)
            {
                return new SourceMeterReading(_complianceVolts, true);
            }

            return new SourceMeterReading(v + _rng.NextNormal(0, _definition.NoiseVolts), false);
        }
    }

    private void Gate()
    {
        if (_faults.OnCommand() is { } fault)
        {
            throw SimulatedCall.FaultFor(fault, InstrumentName);
        }
    }
}
