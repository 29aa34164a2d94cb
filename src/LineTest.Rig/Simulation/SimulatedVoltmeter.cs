using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// A simulated multi-channel DC voltmeter. A slot's output channel reads its unit's output, its supply channel the
/// drop across the supply shunt (supply current × <see cref="SlotDefinition.SupplyShuntOhms"/>); any other channel,
/// or a slot without a unit, reads an open input: about 0 V. Every reading carries meter noise and is rounded to the
/// meter's resolution.
/// </summary>
/// <remarks>
/// A reading returns at once: the simulator never waits on a timer (the virtual clock belongs to the coordinator's
/// single flow), so the coordinator accounts the integration time itself (<see cref="MeasurementSeconds"/>).
/// </remarks>
public sealed class SimulatedVoltmeter : IVoltmeter
{
    /// <summary>Meter noise at 1 PLC, volts (1σ); it falls as 1/√PLC with longer integration. Invented typical figure.</summary>
    public const double NoiseVoltsAtOnePlc = 2e-6;

    /// <summary>One power-line cycle at 50 Hz, seconds.</summary>
    public const double SecondsPerPlc = 0.020;

    private const string InstrumentName = "meter";

    // Concurrency: _rng and _faults are guarded by _lock; slot state by each slot's own lock (taken after _lock).
    private readonly Lock _lock = new();
    private readonly MeterDefinition _definition;
    private readonly IReadOnlyDictionary<int, (SimulatedSlot Slot, bool IsSupply)> _channels;
    private readonly Random _rng;
    private readonly FaultGate _faults = new();
    private readonly double _noiseVolts;

    internal SimulatedVoltmeter(MeterDefinition definition, IEnumerable<SimulatedSlot> slots, int seed)
    {
        ArgumentNullException.ThrowIfNull(definition);
        if (!(definition.IntegrationPlc > 0) || !double.IsFinite(definition.IntegrationPlc))
        {
            throw new ArgumentOutOfRangeException(nameof(definition), definition.IntegrationPlc, "meter.integrationPlc must be a positive number of power-line cycles.");
        }

        _definition = definition;
        var channels = new Dictionary<int, (SimulatedSlot, bool)>();
        foreach (var slot in slots)
        {
            channels.Add(slot.Definition.OutputChannel, (slot, false));
            channels.Add(slot.Definition.SupplyChannel, (slot, true));
        }

        _channels = channels;
        _rng = new Random(seed);
        _noiseVolts = NoiseVoltsAtOnePlc / Math.Sqrt(definition.IntegrationPlc);
    }

    /// <summary>How long one reading takes, seconds: the integration time at 50 Hz mains.</summary>
    public double MeasurementSeconds => _definition.IntegrationPlc * SecondsPerPlc;

    /// <inheritdoc/>
    public Task<double> ReadDcVoltsAsync(int channel, CancellationToken cancellationToken)
        => SimulatedCall.Run(() => ReadDcVolts(channel), cancellationToken);

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

    private double ReadDcVolts(int channel)
    {
        lock (_lock)
        {
            if (_faults.OnCommand() is { } fault)
            {
                throw SimulatedCall.FaultFor(fault, InstrumentName);
            }

            if (channel < 1)
            {
                throw new InstrumentFaultException(InstrumentName, InstrumentFaultKind.InstrumentError, $"channel {channel} does not exist (channels start at 1)");
            }

            var signal = 0.0;
            if (_channels.TryGetValue(channel, out var route))
            {
                lock (route.Slot.Gate)
                {
                    if (route.Slot.CurrentUnitLocked() is { } unit)
                    {
                        signal = route.IsSupply
                            ? unit.Parameters.SupplyCurrentAmps * route.Slot.Definition.SupplyShuntOhms
                            : unit.SampleOutputVolts();
                    }
                }
            }

            var reading = signal + _rng.NextNormal(0, _noiseVolts);
            if (Math.Abs(reading) > _definition.RangeVolts * 1.2)
            {
                throw new InstrumentFaultException(InstrumentName, InstrumentFaultKind.InstrumentError, $"channel {channel} overload on the {_definition.RangeVolts} V range");
            }

            var resolution = _definition.ResolutionVolts;
            return resolution > 0 ? Math.Round(reading / resolution) * resolution : reading;
        }
    }
}
