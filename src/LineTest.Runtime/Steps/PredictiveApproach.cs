using System.Globalization;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;

namespace LineTest.Runtime.Steps;

/// <summary>
/// The approach to one setpoint in predictive settle mode: one <see cref="PredictiveSettleTracker"/> for the reference
/// (°C) and one per unit (the quantity its readings at this setpoint are taken in — meter volts, raw counts or the °C it
/// reports — over the sequence's sensitivity, so in °C of the unit's own scale). It decides for the whole batch, since the units share one source: the readings are taken
/// when the reference and every unit still in progress say take; the setpoint falls back to the window as soon as one
/// of them falls back. After the take, the fits are frozen and move later samples to the final value
/// (<see cref="ReferenceShiftC"/>, <see cref="UnitShiftC"/>). Touched only by the coordinator's loop.
/// </summary>
internal sealed class PredictiveApproach
{
    private readonly Dictionary<UnitContext, PredictiveSettleTracker> _units = [];
    private readonly Dictionary<UnitContext, double> _unitFirst = [];
    private double _referenceFirst = double.NaN;
    private readonly double _maxUncertaintyC;
    private readonly double _fitSpanSeconds;

    public PredictiveApproach(SetpointDefinition setpoint, SettleSettings settle, StabilitySettings stability, double fitSpanSeconds, double outputPerC,
        DateTimeOffset commanded, UnitRead tracked)
    {
        Tracked = tracked;
        Setpoint = setpoint;
        Commanded = commanded;
        OutputPerC = outputPerC;
        _maxUncertaintyC = settle.MaxExtrapolationUncertaintyC
            ?? throw new InvalidOperationException("Checked sequences give maxExtrapolationUncertaintyC in predictive mode.");
        _fitSpanSeconds = fitSpanSeconds;
        Reference = new PredictiveSettleTracker(setpoint.Celsius, stability.MaxOffsetFromSetpointC, _maxUncertaintyC, fitSpanSeconds);
    }

    public SetpointDefinition Setpoint { get; }

    /// <summary>When the setpoint was commanded: the time origin of every tracker.</summary>
    public DateTimeOffset Commanded { get; }

    /// <summary>The quantity each unit is followed in (<see cref="Tracked"/>) per °C, as the sequence gives it.</summary>
    public double OutputPerC { get; }

    /// <summary>What is read of each unit while it approaches.</summary>
    public UnitRead Tracked { get; }

    public PredictiveSettleTracker Reference { get; }

    /// <summary>True once the readings were taken from the predictions (the fits are then frozen).</summary>
    public bool Taken { get; private set; }

    /// <summary>Why the setpoint fell back to the window, or null.</summary>
    public string? FallbackReason { get; private set; }

    public double Seconds(DateTimeOffset at) => (at - Commanded).TotalSeconds;

    public void AddReference(DateTimeOffset at, double celsius)
    {
        if (double.IsNaN(_referenceFirst))
        {
            _referenceFirst = celsius;
        }

        Reference.Add(Seconds(at), celsius);
    }

    public void AddUnit(UnitContext unit, DateTimeOffset at, double output)
    {
        if (!_units.TryGetValue(unit, out var tracker))
        {
            // A unit's offset from the setpoint is unknown before its trim: only the reference is held to the band.
            tracker = new PredictiveSettleTracker(0, double.PositiveInfinity, _maxUncertaintyC, _fitSpanSeconds);
            _units[unit] = tracker;
        }

        _unitFirst.TryAdd(unit, output / OutputPerC);

        // The unit follows the block through its own lag: its fit takes the reference's fitted time constant.
        tracker.AddFollowing(Seconds(at), output / OutputPerC, Reference.Last?.Fit);
    }

    public PredictiveSettleTracker? TrackerOf(UnitContext unit) => _units.GetValueOrDefault(unit);

    /// <summary>
    /// Decides for the batch after a round of readings of the reference and of <paramref name="units"/> (those still in
    /// progress): take, keep waiting, or fall back (remembered with its reason).
    /// </summary>
    public PredictiveSettleOutcome Decide(IReadOnlyList<UnitContext> units)
    {
        if (Reference.Last is { Outcome: PredictiveSettleOutcome.FallBack } r)
        {
            return FallBack($"reference: {r.Why}");
        }

        foreach (var unit in units)
        {
            if (TrackerOf(unit)?.Last is { Outcome: PredictiveSettleOutcome.FallBack } u)
            {
                return FallBack($"slot {unit.Slot.ToString(CultureInfo.InvariantCulture)}: {u.Why}");
            }
        }

        var all = Reference.Last?.Outcome == PredictiveSettleOutcome.Take
            && units.All(u => TrackerOf(u)?.Last?.Outcome == PredictiveSettleOutcome.Take);
        if (all)
        {
            Taken = true;
            return PredictiveSettleOutcome.Take;
        }

        return PredictiveSettleOutcome.KeepWaiting;
    }

    /// <summary>Falls back with <paramref name="why"/> (the first reason is kept).</summary>
    public PredictiveSettleOutcome FallBack(string why)
    {
        FallbackReason ??= why;
        return PredictiveSettleOutcome.FallBack;
    }

    /// <summary>What the reference still has to move from <paramref name="at"/> to its final value, °C (y∞ − f(t)).</summary>
    public double ReferenceShiftC(DateTimeOffset at) => Reference.Last!.Fit.FinalValue - Reference.PredictedAt(Seconds(at));

    /// <summary>
    /// How much of the unit's own scale (its soak quantity over the sequence's sensitivity) one °C of the well makes,
    /// from the whole approach: the unit's move from its first reading to its final value over the reference's. The
    /// sequence may give the sensitivity's size only (a diode's counts fall as it warms), and a part's own slope
    /// differs from the nominal; steps shorter than 1 °C keep the nominal +1, and a ratio outside 0.5 … 2 (not a
    /// plausible part) keeps only its sign.
    /// </summary>
    public double ScaleOf(UnitContext unit)
    {
        var reference = Reference.Last!.Fit.FinalValue - _referenceFirst;
        if (!(Math.Abs(reference) >= 1) || _units[unit].Last?.Fit is not { Converged: true } fit)
        {
            return 1;
        }

        var ratio = (fit.FinalValue - _unitFirst[unit]) / reference;
        return Math.Abs(ratio) is >= 0.5 and <= 2 ? ratio : Math.Sign(ratio) is 0 ? 1 : Math.Sign(ratio);
    }

    /// <summary>What the unit still has to move from <paramref name="at"/> to its final value, °C of its own scale.</summary>
    public double UnitShiftC(UnitContext unit, DateTimeOffset at)
    {
        var tracker = _units[unit];
        return tracker.Last!.Fit.FinalValue - tracker.PredictedAt(Seconds(at));
    }
}
