using LineTest.Core.Results;
using LineTest.Core.Units;

namespace LineTest.Station.Screen;

/// <summary>Plain words for states and verdicts on the operator screen.</summary>
public static class StateWords
{
    /// <summary>What a state means to the operator.</summary>
    public static string Of(UnitState? state) => state switch
    {
        null => "empty",
        UnitState.Loaded => "loaded",
        UnitState.Identifying => "identifying",
        UnitState.CheckingSupply => "checking supply",
        UnitState.WaitingForSource => "waiting for block",
        UnitState.Soaking => "soaking",
        UnitState.Measuring => "measuring",
        UnitState.Trimming => "trimming",
        UnitState.Verifying => "verifying",
        UnitState.AwaitingOperator => "waiting for you",
        UnitState.Passed => "done",
        UnitState.Failed => "done",
        UnitState.Errored => "stopped",
        UnitState.InProgress => "in progress",
        _ => state.ToString()!.ToLowerInvariant(),
    };

    /// <summary>The big verdict word.</summary>
    public static string Of(Verdict verdict) => verdict switch
    {
        Verdict.Pass => "PASS",
        Verdict.Fail => "FAIL",
        _ => "ERROR",
    };
}
