using LineTest.Core.Results;
using LineTest.Core.Units;
using LineTest.Factory.Forwarding;
using LineTest.Runtime.Batches;

namespace LineTest.Station.Screen;

/// <summary>
/// The operator screen's state, fed by the coordinator (as its <see cref="IBatchObserver"/>) and by the scanner.
/// Read by the renderer from another thread, so every member is guarded by one lock.
/// </summary>
public sealed class StationScreenModel : IBatchObserver
{
    /// <summary>Above this block temperature the screen warns of hot surfaces, °C (common practice: about 45 °C burns on contact).</summary>
    public const double HotAboveC = 45;

    /// <summary>Below this block temperature the screen warns of cold surfaces, °C.</summary>
    public const double ColdBelowC = 5;

    private readonly Lock _gate = new();
    private ScreenHeader _header;
    private readonly TimeProvider _time;
    private readonly double[] _expectedStepSeconds;
    private readonly Dictionary<int, SlotView> _slots;
    private readonly Dictionary<int, (int Step, DateTimeOffset Since)> _stepStarted = [];
    private double? _setpointC;
    private double? _referenceC;
    private string _phase = "idle";
    private string _prompt = string.Empty;
    private string? _alarm;
    private string? _notice;
    private IReadOnlyList<string> _info = [];

    /// <summary>Creates the model.</summary>
    /// <param name="header">Station, fixture, sequence, lot and operator line.</param>
    /// <param name="slots">The fixture's slot numbers.</param>
    /// <param name="expectedStepSeconds">Expected duration of each step (for time left), in sequence order.</param>
    /// <param name="time">Clock used to time steps.</param>
    public StationScreenModel(ScreenHeader header, IEnumerable<int> slots, IReadOnlyList<double> expectedStepSeconds, TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(header);
        ArgumentNullException.ThrowIfNull(slots);
        ArgumentNullException.ThrowIfNull(expectedStepSeconds);
        _header = header;
        _time = time;
        _expectedStepSeconds = [.. expectedStepSeconds];
        _slots = slots.ToDictionary(s => s, s => new SlotView(s));
        _prompt = "Scan the serial of the unit in slot " + _slots.Keys.Min() + ".";
    }

    /// <summary>Header facts (the operator and the lot change when scanned at the station).</summary>
    public ScreenHeader Header
    {
        get
        {
            lock (_gate)
            {
                return _header;
            }
        }

        set
        {
            lock (_gate)
            {
                _header = value;
            }
        }
    }

    /// <summary>The words for what a unit is doing; null: the state's words.</summary>
    public StepWords? Words { get; init; }

    /// <summary>The forwarding backlog to show (count, oldest, why it waits); null when the station forwards nowhere.</summary>
    public IFactoryBacklog? Factory { get; init; }

    /// <summary>A consistent copy of everything on screen.</summary>
    public ScreenSnapshot Snapshot()
    {
        // The backlog is replaced whole by the forwarding loop, so it is read outside the lock.
        var factory = Factory?.Current;
        lock (_gate)
        {
            return new ScreenSnapshot(_header, _slots.Values.OrderBy(s => s.Slot).Select(WithTimeLeft).ToList(), _setpointC, _referenceC, _phase, _prompt, Caution(), _alarm, _notice, _info, factory);
        }
    }

    /// <summary>Shows a prompt to the operator.</summary>
    public void Prompt(string text)
    {
        lock (_gate)
        {
            _prompt = text;
        }
    }

    /// <summary>
    /// Shows a notice above the prompt (a refused scan and why, news about the scanner) without replacing the prompt;
    /// null clears it. A unit loaded into a slot, and unloading the fixture, clear it too.
    /// </summary>
    public void Notice(string? text)
    {
        lock (_gate)
        {
            _notice = text;
        }
    }

    /// <summary>Shows lines below the table (a unit's history) until replaced; empty clears them.</summary>
    public void Info(IReadOnlyList<string> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        lock (_gate)
        {
            _info = lines;
        }
    }

    /// <summary>Marks a slot out of service with <paramref name="reason"/>, or back in service (null).</summary>
    public void OutOfService(int slot, string? reason)
    {
        lock (_gate)
        {
            _slots[slot] = new SlotView(slot) { OutOfService = reason };
        }
    }

    /// <summary>Shows a station-wide alarm (e.g. results cannot be stored) until cleared.</summary>
    public void Alarm(string? text)
    {
        lock (_gate)
        {
            _alarm = text;
        }
    }

    /// <summary>A serial was scanned into a slot.</summary>
    public void Loaded(int slot, string serial, bool isRetest)
    {
        lock (_gate)
        {
            _notice = null;
            _slots[slot] = new SlotView(slot) { Serial = serial, State = UnitState.Loaded, Step = "waiting for start", IsRetest = isRetest, Doing = isRetest ? "loaded (retest)" : "loaded" };
            _stepStarted.Remove(slot);
        }
    }

    /// <summary>The operator unloaded the fixture.</summary>
    public void UnloadAll()
    {
        lock (_gate)
        {
            _notice = null;
            _info = [];
            foreach (var slot in _slots.Keys.ToList())
            {
                _slots[slot] = new SlotView(slot) { OutOfService = _slots[slot].OutOfService };
            }

            _stepStarted.Clear();
        }
    }

    /// <inheritdoc />
    public void UnitChanged(int slot, string serial, UnitState state, string step, int stepIndex, int stepCount)
    {
        lock (_gate)
        {
            if (!_stepStarted.TryGetValue(slot, out var started) || started.Step != stepIndex)
            {
                _stepStarted[slot] = (stepIndex, _time.GetUtcNow());
            }

            var current = _slots.TryGetValue(slot, out var view) ? view : new SlotView(slot);
            var done = state is UnitState.Passed or UnitState.Failed or UnitState.Errored;
            _slots[slot] = current with
            {
                Serial = serial,
                State = state,
                Step = done ? string.Empty : step,
                Progress = done ? current.Progress : stepCount == 0 ? 0 : (double)stepIndex / stepCount,
                Doing = done ? string.Empty : Words?.Of(state, step, _setpointC) ?? string.Empty,
            };
        }
    }

    /// <inheritdoc />
    public void UnitFinished(RunRecord run)
    {
        ArgumentNullException.ThrowIfNull(run);
        lock (_gate)
        {
            var current = _slots.TryGetValue(run.Slot, out var view) ? view : new SlotView(run.Slot);
            var cancelled = run.Verdict == Verdict.Error && run.Reason is { } why && why.StartsWith("cancelled", StringComparison.OrdinalIgnoreCase);
            _slots[run.Slot] = current with
            {
                Verdict = run.Verdict,
                Reason = run.Reason,
                Progress = cancelled ? current.Progress : 1,
                Step = string.Empty,
                Doing = cancelled ? "cancelled" : string.Empty,
                TimeLeft = TimeSpan.Zero,
                Disposition = run.Disposition,
                Cancelled = cancelled,
            };
        }
    }

    /// <inheritdoc />
    public void SourceChanged(double? setpointC, double? referenceC, string phase)
    {
        lock (_gate)
        {
            _setpointC = setpointC ?? _setpointC;
            _referenceC = referenceC ?? _referenceC;
            _phase = phase;
        }
    }

    private SlotView WithTimeLeft(SlotView view)
    {
        if (view.Verdict is null && view.State is { } state and not UnitState.Loaded && Words is { } words)
        {
            // Named at drawing time: the block's setpoint may have changed since the unit's last step change.
            view = view with { Doing = words.Of(state, view.Step, _setpointC) };
        }

        if (view.Verdict is not null || view.State is null or UnitState.Loaded || !_stepStarted.TryGetValue(view.Slot, out var started))
        {
            return view;
        }

        var inStep = (_time.GetUtcNow() - started.Since).TotalSeconds;
        var left = 0.0;
        for (var i = started.Step; i < _expectedStepSeconds.Length; i++)
        {
            left += i == started.Step ? Math.Max(0, _expectedStepSeconds[i] - inStep) : _expectedStepSeconds[i];
        }

        return view with { TimeLeft = TimeSpan.FromSeconds(Math.Round(left)) };
    }

    private string? Caution()
    {
        var t = _referenceC;
        if (t is > HotAboveC)
        {
            return $"HOT: the block is at {t:0} °C. Do not touch the block or inserts; use tongs or gloves.";
        }

        if (t is < ColdBelowC)
        {
            return $"COLD: the block is at {t:0} °C. Cold surfaces can freeze skin; use gloves.";
        }

        return null;
    }
}
