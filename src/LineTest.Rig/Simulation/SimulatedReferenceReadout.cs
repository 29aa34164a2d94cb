using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// A simulated reference thermometer in the block's reference well. It reports its sensor's raw quantity at the
/// well temperature through the conversion it is given (e.g. the Callendar–Van Dusen resistance of a PRT), with
/// readout noise (expressed in °C so it suits any raw unit) and rounding to the readout's resolution.
/// </summary>
public sealed class SimulatedReferenceReadout : IReferenceReadout
{
    /// <summary>Default readout noise, °C (1σ). Invented typical figure for a precision PRT readout.</summary>
    public const double DefaultNoiseC = 0.0005;

    private const string InstrumentName = "reference";

    // Concurrency: _rng, _faults and the drift fields are guarded by _lock.
    private readonly Lock _lock = new();
    private readonly SimulatedDryBlock _block;
    private readonly Func<double, double> _celsiusToRaw;
    private readonly double _resolution;
    private readonly double _noiseC;
    private readonly TimeProvider _timeProvider;
    private readonly Random _rng;
    private readonly FaultGate _faults = new();
    private double _driftCPerHour;
    private DateTimeOffset _driftStart;

    /// <summary>Creates a readout in <paramref name="block"/>'s reference well.</summary>
    /// <param name="block">The block whose reference well the sensor sits in.</param>
    /// <param name="celsiusToRaw">The sensor's raw quantity (Ω, mV or °C) as a function of temperature, °C.</param>
    /// <param name="resolution">Readout resolution in the raw unit; 0 for none.</param>
    /// <param name="timeProvider">The (virtual) clock, for drift faults.</param>
    /// <param name="seed">Seed of the readout noise.</param>
    /// <param name="noiseC">Readout noise, °C (1σ).</param>
    public SimulatedReferenceReadout(SimulatedDryBlock block, Func<double, double> celsiusToRaw, double resolution, TimeProvider timeProvider, int seed, double noiseC = DefaultNoiseC)
    {
        ArgumentNullException.ThrowIfNull(block);
        ArgumentNullException.ThrowIfNull(celsiusToRaw);
        ArgumentNullException.ThrowIfNull(timeProvider);
        if (!double.IsFinite(resolution) || resolution < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(resolution), resolution, "reference.readoutResolution must be zero or positive.");
        }

        if (!double.IsFinite(noiseC) || noiseC < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(noiseC), noiseC, "The readout noise must be zero or positive.");
        }

        _block = block;
        _celsiusToRaw = celsiusToRaw;
        _resolution = resolution;
        _noiseC = noiseC;
        _timeProvider = timeProvider;
        _rng = new Random(seed);
    }

    /// <inheritdoc/>
    public Task<double> ReadRawAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(ReadRaw, cancellationToken);

    internal void ArmFault(RigFault fault)
    {
        lock (_lock)
        {
            if (fault.Kind == RigFaultKind.ReferenceDrift)
            {
                _driftCPerHour = fault.DriftCPerHour;
                _driftStart = _timeProvider.GetUtcNow();
            }
            else
            {
                _faults.Arm(fault);
            }
        }
    }

    internal void ClearFaults()
    {
        lock (_lock)
        {
            _faults.Clear();
            _driftCPerHour = 0;
        }
    }

    private double ReadRaw()
    {
        lock (_lock)
        {
            if (_faults.OnCommand() is { } fault)
            {
                throw SimulatedCall.FaultFor(fault, InstrumentName);
            }

            var drift = _driftCPerHour == 0 ? 0 : _driftCPerHour * (_timeProvider.GetUtcNow() - _driftStart).TotalHours;
            var celsius = _block.SampleTemperatureC() + drift + (_noiseC > 0 ? _rng.NextNormal(0, _noiseC) : 0);
            var raw = _celsiusToRaw(celsius);
            if (!double.IsFinite(raw))
            {
                throw new InstrumentFaultException(InstrumentName, InstrumentFaultKind.InstrumentError, $"sensor out of range at {celsius:F3} °C");
            }

            return _resolution > 0 ? Math.Round(raw / _resolution) * _resolution : raw;
        }
    }
}
