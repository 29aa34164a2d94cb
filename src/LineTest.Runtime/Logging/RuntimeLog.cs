using LineTest.Core.Results;
using Microsoft.Extensions.Logging;

namespace LineTest.Runtime.Logging;

/// <summary>Source-generated log messages of the runtime, with stable event ids (1000–1099).</summary>
internal static partial class RuntimeLog
{
    [LoggerMessage(EventId = 1000, Level = LogLevel.Information,
        Message = "Run ended {Serial} slot {Slot} {Verdict} {Reason}run {RunId} sequence {SequenceId} r{Revision} station {Station} batch {BatchId}")]
    public static partial void RunEnded(ILogger logger, string serial, int slot, string verdict, string? reason, Guid runId,
        string sequenceId, int revision, string station, string? batchId);

    [LoggerMessage(EventId = 1001, Level = LogLevel.Information, Message = "Batch {BatchId} started: {Units} units, sequence {SequenceId} r{Revision}")]
    public static partial void BatchStarted(ILogger logger, string batchId, int units, string sequenceId, int revision);

    [LoggerMessage(EventId = 1002, Level = LogLevel.Information,
        Message = "Source stable at {Setpoint} ({TargetC} °C): reference {ReferenceC:F3} °C after {Seconds:F0} s")]
    public static partial void SourceStable(ILogger logger, string setpoint, double targetC, double referenceC, double seconds);

    [LoggerMessage(EventId = 1003, Level = LogLevel.Warning, Message = "Unit {Serial} in slot {Slot}: {Reason}")]
    public static partial void UnitFault(ILogger logger, string serial, int slot, string reason);

    [LoggerMessage(EventId = 1004, Level = LogLevel.Error, Message = "Batch {BatchId} stopped: {Reason}")]
    public static partial void BatchAborted(ILogger logger, string batchId, string reason);

    [LoggerMessage(EventId = 1005, Level = LogLevel.Information, Message = "Source sent to standby ({StandbyC} °C): {Why}")]
    public static partial void Standby(ILogger logger, double standbyC, string why);

    [LoggerMessage(EventId = 1006, Level = LogLevel.Critical, Message = "Could not send the source to standby: {Reason}")]
    public static partial void StandbyFailed(ILogger logger, string reason);

    [LoggerMessage(EventId = 1007, Level = LogLevel.Critical, Message = "Run of {Serial} could not be stored: {Reason}. The station takes no new units.")]
    public static partial void StoreFailed(ILogger logger, string serial, string reason);

    [LoggerMessage(EventId = 1008, Level = LogLevel.Debug, Message = "Unit {Serial} slot {Slot}: {From} -> {To} ({Trigger})")]
    public static partial void Transition(ILogger logger, string serial, int slot, string from, string to, string trigger);

    public static string Word(Verdict verdict) => verdict.ToWord();

    [LoggerMessage(EventId = 1040, Level = LogLevel.Debug, Message = "Batch {BatchId}: block at {BlockC:F1} °C, setpoints in order {Order}")]
    public static partial void SetpointOrder(ILogger logger, string batchId, double blockC, string order);

    [LoggerMessage(EventId = 1041, Level = LogLevel.Information,
        Message = "Predictive settle at {Setpoint} ({TargetC} °C): readings taken {Seconds:F0} s after the command, reference predicted {PredictedC:F3} °C, u {UncertaintyC:F4} °C")]
    public static partial void PredictiveTaken(ILogger logger, string setpoint, double targetC, double seconds, double predictedC, double uncertaintyC);

    [LoggerMessage(EventId = 1042, Level = LogLevel.Information, Message = "Predictive settle at {Setpoint} fell back to the stability window: {Why}")]
    public static partial void PredictiveFellBack(ILogger logger, string setpoint, string why);
}
