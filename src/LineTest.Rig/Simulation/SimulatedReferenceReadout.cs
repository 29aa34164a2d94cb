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
    private readonly double _lagSeconds;
    private double _driftCPerHour;
    private DateTimeOffset _driftStart;
    private double _sensorC;
    private DateTimeOffset _sensorTime;

    /// <summary>Creates a readout in <paramref name="block"/>'s reference well.</summary>
    /// <param name="block">The block whose reference well the sensor sits in.</param>
    /// <param name="celsiusToRaw">The sensor's raw quantity (Ω, mV or °C) as a function of temperature, °C.</param>
    /// <param name="resolution">Readout resolution in the raw unit; 0 for none.</param>
    /// <param name="timeProvider">The (virtual) clock, for drift faults.</param>
    /// <param name="seed">Seed of the readout noise.</param>
    /// <param name="noiseC">Readout noise, °C (1σ).</param>
    /// <param name="lagSeconds">The sensor's own response time in its well, seconds (0: it reads the well as it is).</param>
    public SimulatedReferenceReadout(
        SimulatedDryBlock block, Func<double, double> celsiusToRaw, double resolution, TimeProvider timeProvider, int seed, double noiseC = DefaultNoiseC,
        double lagSeconds = 0)
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
        if (!double.IsFinite(lagSeconds) || lagSeconds < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(lagSeconds), lagSeconds, "simulation.referenceLagTimeConstantSeconds must be zero or positive.");
        }

        _lagSeconds = lagSeconds;
        _sensorTime = timeProvider.GetUtcNow();
        _sensorC = block.TrueTemperatureAt(_sensorTime);
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
            var celsius = SensedLocked() + drift + (_noiseC > 0 ? _rng.NextNormal(0, _noiseC) : 0);
            var raw = _celsiusToRaw(celsius);
            if (!double.IsFinite(raw))
            {
                throw new InstrumentFaultException(InstrumentName, InstrumentFaultKind.InstrumentError, $"sensor out of range at {celsius:F3} °C");
            }

            return _resolution > 0 ? Math.Round(raw / _resolution) * _resolution : raw;
        }
    }

    /// <summary>
    /// Under the lock: the well as the sensor senses it now — the block's sample (true value and noise) with, when the
    /// sensor has a response time, the true value replaced by the sensor's exact first-order lag behind the well.
    /// </summary>
    private double SensedLocked()
    {
        var sample = _block.SampleTemperatureC();
        if (_lagSeconds <= 0)
        {
            return sample;
        }

        var now = _timeProvider.GetUtcNow();
        _sensorC = _block.Follow(_sensorC, _sensorTime, now, _lagSeconds);
        _sensorTime = now;
        return sample - _block.TrueTemperatureAt(now) + _sensorC;
    }
}
