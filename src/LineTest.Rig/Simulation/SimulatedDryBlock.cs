using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// A simulated dry block. Its controller behaves as a rate-limited first-order system,
/// <c>dT/dt = clamp((S − T)/τ, −RampDown, +RampUp)</c>: far from the setpoint S it ramps at the limit rate, and
/// once the remaining error has fallen to <c>rate·τ</c> (where the first-order slope equals the ramp rate, so the
/// curve is smooth) it approaches S exponentially with time constant τ. The state is computed in closed form from
/// virtual time, so hours of virtual time cost nothing; a new setpoint starts a new segment from the temperature
/// reached at that moment.
/// </summary>
/// <remarks>
/// The block starts at its standby temperature. Readings of its control sensor carry Gaussian noise
/// (<see cref="SimulationDefinition.BlockNoiseC"/>) once it is in the exponential approach. Slot wells differ from
/// the reference well by the static offsets <see cref="SimulationDefinition.SlotOffsetsC"/>. Units follow the
/// noise-free well temperature: block noise is far faster and smaller than a unit's thermal lag filters out.
/// </remarks>
public sealed class SimulatedDryBlock : ITemperatureSource
{
    private const string InstrumentName = "source";

    // Concurrency: _segments, _rng, _gate's faults and _heaterFault are guarded by _lock.
    private readonly Lock _lock = new();
    private readonly List<Segment> _segments = [];
    private readonly TimeProvider _timeProvider;
    private readonly Random _rng;
    private readonly FaultGate _faults = new();
    private readonly double _rampUpCPerSecond;
    private readonly double _rampDownCPerSecond;
    private readonly double _tauSeconds;
    private readonly double _noiseC;
    private readonly IReadOnlyList<double> _slotOffsetsC;
    private bool _heaterFault;

    /// <summary>Creates a block at its standby temperature at the provider's current time.</summary>
    /// <param name="source">Ramp limits, settling time constant, standby and safe range.</param>
    /// <param name="simulation">Block noise and slot offsets.</param>
    /// <param name="timeProvider">The (virtual) clock.</param>
    /// <param name="seed">Seed of the block's noise.</param>
    /// <param name="ambientC">Room temperature, °C, that the block drifts to if its heater fails.</param>
    public SimulatedDryBlock(SourceDefinition source, SimulationDefinition simulation, TimeProvider timeProvider, int seed, double ambientC = SimulatedRig.DefaultAmbientC)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(simulation);
        ArgumentNullException.ThrowIfNull(timeProvider);
        RequirePositive(source.RampUpCPerMinute, "source.rampUpCPerMinute");
        RequirePositive(source.RampDownCPerMinute, "source.rampDownCPerMinute");
        RequirePositive(source.SettlingTimeConstantSeconds, "source.settlingTimeConstantSeconds");
        if (!double.IsFinite(simulation.BlockNoiseC) || simulation.BlockNoiseC < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(simulation), simulation.BlockNoiseC, "simulation.blockNoiseC must be zero or a positive number of °C.");
        }

        Source = source;
        AmbientC = ambientC;
        _timeProvider = timeProvider;
        _rng = new Random(seed);
        _rampUpCPerSecond = source.RampUpCPerMinute / 60.0;
        _rampDownCPerSecond = source.RampDownCPerMinute / 60.0;
        _tauSeconds = source.SettlingTimeConstantSeconds;
        _noiseC = simulation.BlockNoiseC;
        _slotOffsetsC = simulation.SlotOffsetsC;
        _segments.Add(new Segment(timeProvider.GetUtcNow(), source.StandbyC, source.StandbyC));
    }

    /// <summary>The source definition the block was built from.</summary>
    public SourceDefinition Source { get; }

    /// <summary>Room temperature, °C.</summary>
    public double AmbientC { get; }

    /// <summary>The setpoint the block is controlling to now, °C.</summary>
    public double SetpointC
    {
        get
        {
            lock (_lock)
            {
                return _segments[^1].SetpointC;
            }
        }
    }

    /// <summary>Noise-free temperature of the reference well now, °C.</summary>
    public double TrueTemperatureC() => TrueTemperatureAt(_timeProvider.GetUtcNow());

    /// <summary>Noise-free temperature of the reference well at <paramref name="time"/>, °C.</summary>
    public double TrueTemperatureAt(DateTimeOffset time)
    {
        lock (_lock)
        {
            var segment = _segments[IndexAt(time)];
            return TemperatureIn(segment, Seconds(time - segment.Start));
        }
    }

    /// <summary>Static offset of a slot's well from the reference well, °C (0 where the fixture gives none).</summary>
    public double SlotOffsetC(int slot)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(slot, 1);
        return slot <= _slotOffsetsC.Count ? _slotOffsetsC[slot - 1] : 0.0;
    }

    /// <summary>
    /// The time at which the ramp of the current segment ends and the exponential approach begins
    /// (the segment's start when the step is within <c>rate·τ</c>).
    /// </summary>
    public DateTimeOffset RampEndTime()
    {
        lock (_lock)
        {
            var segment = _segments[^1];
            return segment.Start + TimeSpan.FromSeconds(RampSeconds(segment));
        }
    }

    /// <inheritdoc/>
    public Task SetSetpointAsync(double celsius, CancellationToken cancellationToken)
        => SimulatedCall.Run(() => SetSetpoint(celsius), cancellationToken);

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(ReadTemperature, cancellationToken);

    /// <inheritdoc/>
    public Task<SourceStatus> ReadStatusAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(ReadStatus, cancellationToken);

    /// <inheritdoc/>
    public Task GoToStandbyAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(() => SetSetpoint(Source.StandbyC), cancellationToken);

    /// <summary>
    /// Advances a first-order follower (a unit's sensor, time constant <paramref name="tauSeconds"/>) of this block's
    /// reference-well temperature from <paramref name="from"/> to <paramref name="to"/>, exactly for the block's
    /// piecewise linear and exponential course.
    /// </summary>
    internal double Follow(double followerC, DateTimeOffset from, DateTimeOffset to, double tauSeconds)
    {
        if (to <= from)
        {
            return followerC;
        }

        lock (_lock)
        {
            var y = followerC;
            var t = from;
            var index = IndexAt(from);
            while (t < to)
            {
                var segment = _segments[index];
                var segmentEnd = index + 1 < _segments.Count ? _segments[index + 1].Start : DateTimeOffset.MaxValue;
                var pieceEnd = segmentEnd < to ? segmentEnd : to;
                y = FollowWithinSegment(segment, y, Seconds(t - segment.Start), Seconds(pieceEnd - segment.Start), tauSeconds);
                t = pieceEnd;
                index++;
            }

            return y;
        }
    }

    internal void ArmFault(RigFault fault)
    {
        lock (_lock)
        {
            if (fault.Kind == RigFaultKind.SourceHeaterFault)
            {
                _heaterFault = true;
                StartSegment(AmbientC);
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
            _heaterFault = false;
        }
    }

    private static double Seconds(TimeSpan span) => span.TotalSeconds;

    private static void RequirePositive(double value, string name)
    {
        if (!double.IsFinite(value) || value <= 0)
        {
            throw new ArgumentOutOfRangeException(name, value, $"{name} must be a positive number for the simulated source.");
        }
    }

    private void SetSetpoint(double celsius)
    {
        if (!double.IsFinite(celsius))
        {
            throw new ArgumentOutOfRangeException(nameof(celsius), celsius, "A setpoint must be a finite temperature in °C.");
        }

        lock (_lock)
        {
            CheckFaults();
            if (_heaterFault)
            {
                throw new InstrumentFaultException(InstrumentName, InstrumentFaultKind.InstrumentError, "source reports a heater fault and refuses the setpoint (simulated fault)");
            }

            StartSegment(celsius);
        }
    }

    private double ReadTemperature()
    {
        lock (_lock)
        {
            CheckFaults();
            return SampleLocked();
        }
    }

    /// <summary>The reference well's temperature as a sensor in it sees it now: true value plus block noise near the setpoint.</summary>
    internal double SampleTemperatureC()
    {
        lock (_lock)
        {
            return SampleLocked();
        }
    }

    private SourceStatus ReadStatus()
    {
        lock (_lock)
        {
            CheckFaults();
            var actual = SampleLocked();
            return new SourceStatus(_segments[^1].SetpointC, actual, _heaterFault ? "heater fault" : null);
        }
    }

    private void CheckFaults()
    {
        if (_faults.OnCommand() is { } fault)
        {
            throw SimulatedCall.FaultFor(fault, InstrumentName);
        }
    }

    private double SampleLocked()
    {
        var now = _timeProvider.GetUtcNow();
        var segment = _segments[IndexAt(now)];
        var dt = Seconds(now - segment.Start);
        var temperature = TemperatureIn(segment, dt);
        var nearSetpoint = dt >= RampSeconds(segment);
        return nearSetpoint && _noiseC > 0 ? temperature + _rng.NextNormal(0, _noiseC) : temperature;
    }

    private void StartSegment(double setpointC)
    {
        var now = _timeProvider.GetUtcNow();
        var current = _segments[^1];
        var startC = TemperatureIn(current, Seconds(now - current.Start));
        if (now <= current.Start)
        {
            _segments[^1] = new Segment(current.Start, startC, setpointC);
        }
        else
        {
            _segments.Add(new Segment(now, startC, setpointC));
        }
    }

    // Index of the segment in force at `time`; times before the first segment belong to the first (a constant).
    private int IndexAt(DateTimeOffset time)
    {
        for (var i = _segments.Count - 1; i > 0; i--)
        {
            if (_segments[i].Start <= time)
            {
                return i;
            }
        }

        return 0;
    }

    private double RateFor(Segment segment) => segment.SetpointC >= segment.StartC ? _rampUpCPerSecond : _rampDownCPerSecond;

    // Duration of the rate-limited part of a segment, seconds: until |error| = rate·τ.
    private double RampSeconds(Segment segment)
    {
        var rate = RateFor(segment);
        var step = Math.Abs(segment.SetpointC - segment.StartC);
        var knee = rate * _tauSeconds;
        return step > knee ? (step - knee) / rate : 0.0;
    }

    private double TemperatureIn(Segment segment, double dt)
    {
        if (dt <= 0)
        {
            return segment.StartC;
        }

        var rampSeconds = RampSeconds(segment);
        var sign = Math.Sign(segment.SetpointC - segment.StartC);
        if (dt < rampSeconds)
        {
            return segment.StartC + (sign * RateFor(segment) * dt);
        }

        var errorAtKnee = ErrorAtKnee(segment, rampSeconds);
        return segment.SetpointC - (errorAtKnee * Math.Exp(-(dt - rampSeconds) / _tauSeconds));
    }

    // Setpoint minus temperature when the exponential phase begins.
    private double ErrorAtKnee(Segment segment, double rampSeconds)
        => rampSeconds > 0
            ? Math.Sign(segment.SetpointC - segment.StartC) * RateFor(segment) * _tauSeconds
            : segment.SetpointC - segment.StartC;

    private double FollowWithinSegment(Segment segment, double y, double t0, double t1, double tauFollower)
    {
        // Before the segment starts (only for the first segment) the block sits at its start temperature.
        if (t0 < 0)
        {
            var end = Math.Min(t1, 0);
            y = FirstOrderLag.FollowLinear(y, segment.StartC, 0, end - t0, tauFollower);
            t0 = end;
        }

        var rampSeconds = RampSeconds(segment);
        if (t0 < rampSeconds && t1 > t0)
        {
            var end = Math.Min(t1, rampSeconds);
            var slope = Math.Sign(segment.SetpointC - segment.StartC) * RateFor(segment);
            y = FirstOrderLag.FollowLinear(y, segment.StartC + (slope * t0), slope, end - t0, tauFollower);
            t0 = end;
        }

        if (t1 > t0)
        {
            var errorAtT0 = ErrorAtKnee(segment, rampSeconds) * Math.Exp(-(t0 - rampSeconds) / _tauSeconds);
            y = FirstOrderLag.FollowExponential(y, segment.SetpointC, errorAtT0, _tauSeconds, t1 - t0, tauFollower);
        }

        return y;
    }

    /// <summary>One commanded course: from StartC at Start towards SetpointC.</summary>
    private readonly record struct Segment(DateTimeOffset Start, double StartC, double SetpointC);
}
