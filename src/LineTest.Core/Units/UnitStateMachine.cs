using Stateless;
using Stateless.Graph;

namespace LineTest.Core.Units;

/// <summary>
/// The state machine of one unit's run. Owns a Stateless machine in queued firing mode and exposes intent
/// methods. Not thread-safe (neither is Stateless): one batch coordinator loop drives all units of a fixture.
/// </summary>
public sealed class UnitStateMachine
{
    private readonly StateMachine<UnitState, UnitTrigger> _machine;
    private readonly StateMachine<UnitState, UnitTrigger>.TriggerWithParameters<string> _reject;
    private readonly StateMachine<UnitState, UnitTrigger>.TriggerWithParameters<string> _fault;
    private readonly StateMachine<UnitState, UnitTrigger>.TriggerWithParameters<string> _cancel;

    /// <summary>Creates a machine in <see cref="UnitState.Loaded"/>.</summary>
    public UnitStateMachine()
    {
        _machine = new StateMachine<UnitState, UnitTrigger>(UnitState.Loaded, FiringMode.Queued);
        _reject = _machine.SetTriggerParameters<string>(UnitTrigger.Reject);
        _fault = _machine.SetTriggerParameters<string>(UnitTrigger.Fault);
        _cancel = _machine.SetTriggerParameters<string>(UnitTrigger.Cancel);
        Configure();
    }

    /// <summary>Raised after every transition: (from, to, trigger).</summary>
    public event Action<UnitState, UnitState, UnitTrigger>? Transitioned;

    /// <summary>The current state.</summary>
    public UnitState State => _machine.State;

    /// <summary>True once the run has ended (passed, failed or errored).</summary>
    public bool IsFinished => State is UnitState.Passed or UnitState.Failed or UnitState.Errored;

    /// <summary>The reason given with a reject, fault or cancel.</summary>
    public string? Reason { get; private set; }

    /// <summary>An identify step begins.</summary>
    public void BeginIdentify() => Fire(UnitTrigger.Identify);

    /// <summary>An electrical check begins.</summary>
    public void BeginSupplyCheck() => Fire(UnitTrigger.CheckSupply);

    /// <summary>The source is sent to a setpoint.</summary>
    public void AwaitSource() => Fire(UnitTrigger.AwaitSource);

    /// <summary>The source is stable: soak begins.</summary>
    public void SourceStable() => Fire(UnitTrigger.SourceStable);

    /// <summary>A measurement begins.</summary>
    public void BeginMeasure() => Fire(UnitTrigger.Measure);

    /// <summary>The trim begins.</summary>
    public void BeginTrim() => Fire(UnitTrigger.Trim);

    /// <summary>The verify measurement begins.</summary>
    public void BeginVerify() => Fire(UnitTrigger.Verify);

    /// <summary>The operator is prompted.</summary>
    public void BeginPrompt() => Fire(UnitTrigger.Prompt);

    /// <summary>All steps done and within limits.</summary>
    public void Complete() => Fire(UnitTrigger.Complete);

    /// <summary>Ends the run as failed.</summary>
    public void Reject(string reason) => _machine.Fire(_reject, reason);

    /// <summary>Ends the run as errored because something failed.</summary>
    public void Fault(string reason) => _machine.Fire(_fault, reason);

    /// <summary>Ends the run as errored because it was cancelled.</summary>
    public void Cancel(string reason) => _machine.Fire(_cancel, reason);

    /// <summary>True when <paramref name="trigger"/> is allowed now.</summary>
    public bool CanFire(UnitTrigger trigger) => _machine.CanFire(trigger);

    /// <summary>The state graph in DOT (Graphviz).</summary>
    public static string ToDotGraph() => UmlDotGraph.Format(new UnitStateMachine()._machine.GetInfo());

    /// <summary>The state graph in Mermaid.</summary>
    public static string ToMermaidGraph() => MermaidGraph.Format(new UnitStateMachine()._machine.GetInfo());

    private void Fire(UnitTrigger trigger) => _machine.Fire(trigger);

    private void Configure()
    {
        UnitState[] working =
        [
            UnitState.Loaded, UnitState.Identifying, UnitState.CheckingSupply, UnitState.WaitingForSource,
            UnitState.Soaking, UnitState.Measuring, UnitState.Trimming, UnitState.Verifying, UnitState.AwaitingOperator,
        ];

        // Ending triggers are permitted from the superstate so every working state inherits them.
        _machine.Configure(UnitState.InProgress)
            .Permit(UnitTrigger.Complete, UnitState.Passed)
            .Permit(UnitTrigger.Reject, UnitState.Failed)
            .Permit(UnitTrigger.Fault, UnitState.Errored)
            .Permit(UnitTrigger.Cancel, UnitState.Errored);

        // Step triggers: each working state may begin any step (the sequence decides the order), except that
        // the soak only follows a wait for the source; a state re-entered by its own trigger is a reentry.
        var stepTargets = new (UnitTrigger Trigger, UnitState Target)[]
        {
            (UnitTrigger.Identify, UnitState.Identifying),
            (UnitTrigger.CheckSupply, UnitState.CheckingSupply),
            (UnitTrigger.AwaitSource, UnitState.WaitingForSource),
            (UnitTrigger.Measure, UnitState.Measuring),
            (UnitTrigger.Trim, UnitState.Trimming),
            (UnitTrigger.Verify, UnitState.Verifying),
            (UnitTrigger.Prompt, UnitState.AwaitingOperator),
        };

        foreach (var state in working)
        {
            var config = _machine.Configure(state).SubstateOf(UnitState.InProgress);
            foreach (var (trigger, target) in stepTargets)
            {
                if (target == state)
                {
                    config.PermitReentry(trigger);
                }
                else
                {
                    config.Permit(trigger, target);
                }
            }

            if (state == UnitState.WaitingForSource)
            {
                config.Permit(UnitTrigger.SourceStable, UnitState.Soaking);
            }
        }

        _machine.Configure(UnitState.Passed);
        _machine.Configure(UnitState.Failed).OnEntryFrom(_reject, reason => Reason = reason);
        _machine.Configure(UnitState.Errored)
            .OnEntryFrom(_fault, reason => Reason = reason)
            .OnEntryFrom(_cancel, reason => Reason = reason);

        _machine.OnTransitioned(t => Transitioned?.Invoke(t.Source, t.Destination, t.Trigger));
    }
}
