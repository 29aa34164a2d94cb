using LineTest.Core.Units;

namespace LineTest.Core.Tests.Units;

public sealed class UnitStateMachineTests
{
    private static readonly UnitState[] WorkingStates =
    [
        UnitState.Loaded, UnitState.Identifying, UnitState.CheckingSupply, UnitState.WaitingForSource,
        UnitState.Soaking, UnitState.Measuring, UnitState.Trimming, UnitState.Verifying, UnitState.AwaitingOperator,
    ];

    private static readonly UnitState[] FinishedStates = [UnitState.Passed, UnitState.Failed, UnitState.Errored];

    // The step triggers and the state each one leads to (the brief's vocabulary: one state per step kind).
    private static readonly (UnitTrigger Trigger, UnitState Target)[] StepTriggers =
    [
        (UnitTrigger.Identify, UnitState.Identifying),
        (UnitTrigger.CheckSupply, UnitState.CheckingSupply),
        (UnitTrigger.AwaitSource, UnitState.WaitingForSource),
        (UnitTrigger.Measure, UnitState.Measuring),
        (UnitTrigger.Trim, UnitState.Trimming),
        (UnitTrigger.Verify, UnitState.Verifying),
        (UnitTrigger.Prompt, UnitState.AwaitingOperator),
    ];

    public static TheoryData<UnitState, UnitTrigger, UnitState> StepTransitions
    {
        get
        {
            var data = new TheoryData<UnitState, UnitTrigger, UnitState>();
            foreach (var from in WorkingStates)
            {
                foreach (var (trigger, target) in StepTriggers)
                {
                    data.Add(from, trigger, target);
                }
            }

            return data;
        }
    }

    public static TheoryData<UnitState> Working => new(WorkingStates);

    public static TheoryData<UnitState> WorkingExceptWaitingForSource => new(WorkingStates.Where(s => s != UnitState.WaitingForSource));

    public static TheoryData<UnitState, UnitTrigger> FinishedWithEveryTrigger
    {
        get
        {
            var data = new TheoryData<UnitState, UnitTrigger>();
            foreach (var state in FinishedStates)
            {
                foreach (var trigger in Enum.GetValues<UnitTrigger>())
                {
                    data.Add(state, trigger);
                }
            }

            return data;
        }
    }

    [Fact]
    public void Constructor_NewMachine_IsLoadedAndNotFinished()
    {
        var machine = new UnitStateMachine();

        Assert.Equal(UnitState.Loaded, machine.State);
        Assert.False(machine.IsFinished);
        Assert.Null(machine.Reason);
    }

    [Theory]
    [MemberData(nameof(StepTransitions))]
    public void StepTrigger_FromWorkingState_MovesToTheStepsState(UnitState from, UnitTrigger trigger, UnitState to)
    {
        var machine = MachineIn(from);
        var seen = new List<(UnitState, UnitState, UnitTrigger)>();
        machine.Transitioned += (source, destination, fired) => seen.Add((source, destination, fired));

        Assert.True(machine.CanFire(trigger));
        FireStep(machine, trigger);

        Assert.Equal(to, machine.State);
        Assert.False(machine.IsFinished);

        // A step that begins again in its own state (two measures in a row) is a reentry, still reported.
        Assert.Equal([(from, to, trigger)], seen);
    }

    [Fact]
    public void SourceStable_WhileWaitingForSource_StartsTheSoak()
    {
        var machine = MachineIn(UnitState.WaitingForSource);

        Assert.True(machine.CanFire(UnitTrigger.SourceStable));
        machine.SourceStable();

        Assert.Equal(UnitState.Soaking, machine.State);
    }

    [Theory]
    [MemberData(nameof(WorkingExceptWaitingForSource))]
    public void SourceStable_FromAnyOtherState_IsNotAllowed(UnitState state)
    {
        var machine = MachineIn(state);

        Assert.False(machine.CanFire(UnitTrigger.SourceStable));
        Assert.Throws<InvalidOperationException>(machine.SourceStable);
        Assert.Equal(state, machine.State);
    }

    [Theory]
    [MemberData(nameof(Working))]
    public void Complete_FromWorkingState_Passes(UnitState state)
    {
        var machine = MachineIn(state);

        machine.Complete();

        Assert.Equal(UnitState.Passed, machine.State);
        Assert.True(machine.IsFinished);
        Assert.Null(machine.Reason);
    }

    [Theory]
    [MemberData(nameof(Working))]
    public void Reject_FromWorkingState_FailsWithTheReason(UnitState state)
    {
        var machine = MachineIn(state);

        machine.Reject("verify.error 0.62 °C above the high limit 0.5 °C");

        Assert.Equal(UnitState.Failed, machine.State);
        Assert.True(machine.IsFinished);
        Assert.Equal("verify.error 0.62 °C above the high limit 0.5 °C", machine.Reason);
    }

    [Theory]
    [MemberData(nameof(Working))]
    public void Fault_FromWorkingState_ErrorsWithTheReason(UnitState state)
    {
        var machine = MachineIn(state);

        machine.Fault("unit did not answer on its link");

        Assert.Equal(UnitState.Errored, machine.State);
        Assert.True(machine.IsFinished);
        Assert.Equal("unit did not answer on its link", machine.Reason);
    }

    [Theory]
    [MemberData(nameof(Working))]
    public void Cancel_FromWorkingState_ErrorsWithTheReason(UnitState state)
    {
        var machine = MachineIn(state);

        machine.Cancel("cancelled by the operator");

        Assert.Equal(UnitState.Errored, machine.State);
        Assert.Equal("cancelled by the operator", machine.Reason);
    }

    [Theory]
    [MemberData(nameof(FinishedWithEveryTrigger))]
    public void CanFire_FinishedState_RefusesEveryTrigger(UnitState state, UnitTrigger trigger)
    {
        var machine = MachineIn(state);

        Assert.False(machine.CanFire(trigger));
    }

    [Theory]
    [MemberData(nameof(FinishedWithEveryTrigger))]
    public void Fire_FinishedState_ThrowsAndKeepsStateAndReason(UnitState state, UnitTrigger trigger)
    {
        var machine = MachineIn(state);
        var reason = machine.Reason;
        var transitions = 0;
        machine.Transitioned += (_, _, _) => transitions++;

        Assert.Throws<InvalidOperationException>(() => FireAny(machine, trigger));

        Assert.Equal(state, machine.State);
        Assert.Equal(reason, machine.Reason);
        Assert.Equal(0, transitions);
    }

    [Fact]
    public void Transitioned_WholeRun_ReportsEveryStepInOrder()
    {
        var machine = new UnitStateMachine();
        var seen = new List<(UnitState From, UnitState To, UnitTrigger Trigger)>();
        machine.Transitioned += (from, to, trigger) => seen.Add((from, to, trigger));

        machine.BeginIdentify();
        machine.BeginSupplyCheck();
        machine.AwaitSource();
        machine.SourceStable();
        machine.BeginMeasure();
        machine.AwaitSource();
        machine.SourceStable();
        machine.BeginMeasure();
        machine.BeginTrim();
        machine.AwaitSource();
        machine.SourceStable();
        machine.BeginVerify();
        machine.Complete();

        Assert.Equal(
            [
                (UnitState.Loaded, UnitState.Identifying, UnitTrigger.Identify),
                (UnitState.Identifying, UnitState.CheckingSupply, UnitTrigger.CheckSupply),
                (UnitState.CheckingSupply, UnitState.WaitingForSource, UnitTrigger.AwaitSource),
                (UnitState.WaitingForSource, UnitState.Soaking, UnitTrigger.SourceStable),
                (UnitState.Soaking, UnitState.Measuring, UnitTrigger.Measure),
                (UnitState.Measuring, UnitState.WaitingForSource, UnitTrigger.AwaitSource),
                (UnitState.WaitingForSource, UnitState.Soaking, UnitTrigger.SourceStable),
                (UnitState.Soaking, UnitState.Measuring, UnitTrigger.Measure),
                (UnitState.Measuring, UnitState.Trimming, UnitTrigger.Trim),
                (UnitState.Trimming, UnitState.WaitingForSource, UnitTrigger.AwaitSource),
                (UnitState.WaitingForSource, UnitState.Soaking, UnitTrigger.SourceStable),
                (UnitState.Soaking, UnitState.Verifying, UnitTrigger.Verify),
                (UnitState.Verifying, UnitState.Passed, UnitTrigger.Complete),
            ],
            seen);
    }

    [Fact]
    public void Transitioned_HandlerThatFiresAgain_IsQueuedAfterTheCurrentTransition()
    {
        // Queued firing: a trigger fired from inside a handler runs after the current transition has finished,
        // so the handler sees a consistent state and the order of events is the order of causes.
        var machine = new UnitStateMachine();
        var seen = new List<(UnitState From, UnitState To)>();
        machine.Transitioned += (from, to, _) =>
        {
            seen.Add((from, to));
            if (to == UnitState.Identifying)
            {
                machine.Fault("unit answered with a different serial");
                Assert.Equal(UnitState.Identifying, machine.State);
            }
        };

        machine.BeginIdentify();

        Assert.Equal([(UnitState.Loaded, UnitState.Identifying), (UnitState.Identifying, UnitState.Errored)], seen);
        Assert.Equal("unit answered with a different serial", machine.Reason);
    }

    [Fact]
    public void ToDotGraph_ContainsEveryStateName()
    {
        var dot = UnitStateMachine.ToDotGraph();

        Assert.StartsWith("digraph", dot.TrimStart(), StringComparison.Ordinal);
        Assert.All(Enum.GetNames<UnitState>(), name => Assert.Contains(name, dot, StringComparison.Ordinal));
    }

    [Fact]
    public void ToMermaidGraph_ContainsEveryStateName()
    {
        var mermaid = UnitStateMachine.ToMermaidGraph();

        Assert.Contains("stateDiagram", mermaid, StringComparison.Ordinal);
        Assert.All(Enum.GetNames<UnitState>(), name => Assert.Contains(name, mermaid, StringComparison.Ordinal));
    }

    [Fact]
    public void ToDotGraph_SourceStable_AppearsOnlyOnce()
    {
        // Only WaitingForSource leads to Soaking by SourceStable; a second edge would mean another state allows it.
        var dot = UnitStateMachine.ToDotGraph();

        Assert.Single(dot.Split('\n'), line => line.Contains(nameof(UnitTrigger.SourceStable), StringComparison.Ordinal));
    }

    /// <summary>A fresh machine driven along the shortest path to <paramref name="state"/>.</summary>
    private static UnitStateMachine MachineIn(UnitState state)
    {
        var machine = new UnitStateMachine();
        switch (state)
        {
            case UnitState.Loaded:
                break;
            case UnitState.Soaking:
                machine.AwaitSource();
                machine.SourceStable();
                break;
            case UnitState.Passed:
                machine.Complete();
                break;
            case UnitState.Failed:
                machine.Reject("reading out of limits");
                break;
            case UnitState.Errored:
                machine.Fault("meter did not answer");
                break;
            default:
                FireStep(machine, StepTriggers.Single(s => s.Target == state).Trigger);
                break;
        }

        Assert.Equal(state, machine.State);
        return machine;
    }

    private static void FireStep(UnitStateMachine machine, UnitTrigger trigger)
    {
        Action fire = trigger switch
        {
            UnitTrigger.Identify => machine.BeginIdentify,
            UnitTrigger.CheckSupply => machine.BeginSupplyCheck,
            UnitTrigger.AwaitSource => machine.AwaitSource,
            UnitTrigger.Measure => machine.BeginMeasure,
            UnitTrigger.Trim => machine.BeginTrim,
            UnitTrigger.Verify => machine.BeginVerify,
            UnitTrigger.Prompt => machine.BeginPrompt,
            _ => throw new ArgumentOutOfRangeException(nameof(trigger), trigger, "not a step trigger"),
        };
        fire();
    }

    private static void FireAny(UnitStateMachine machine, UnitTrigger trigger)
    {
        switch (trigger)
        {
            case UnitTrigger.SourceStable:
                machine.SourceStable();
                break;
            case UnitTrigger.Complete:
                machine.Complete();
                break;
            case UnitTrigger.Reject:
                machine.Reject("again");
                break;
            case UnitTrigger.Fault:
                machine.Fault("again");
                break;
            case UnitTrigger.Cancel:
                machine.Cancel("again");
                break;
            default:
                FireStep(machine, trigger);
                break;
        }
    }
}
