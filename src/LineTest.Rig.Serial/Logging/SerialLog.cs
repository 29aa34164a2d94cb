using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Logging;

/// <summary>Source-generated log messages of the serial drivers and simulated twins, with stable event ids (3000–3099).</summary>
internal static partial class SerialLog
{
    [LoggerMessage(EventId = 3000, Level = LogLevel.Debug, Message = "{Instrument} on {Port}: sent '{Command}', received '{Reply}'")]
    public static partial void Exchange(ILogger logger, string instrument, string port, string command, string reply);

    [LoggerMessage(EventId = 3001, Level = LogLevel.Debug, Message = "{Instrument} on {Port}: sent '{Command}' (no reply expected)")]
    public static partial void Sent(ILogger logger, string instrument, string port, string command);

    [LoggerMessage(EventId = 3002, Level = LogLevel.Debug, Message = "{Instrument} on {Port}: sent '{Command}', failed: {Reason}")]
    public static partial void ExchangeFailed(ILogger logger, string instrument, string port, string command, string reason);

    [LoggerMessage(EventId = 3003, Level = LogLevel.Warning, Message = "{Instrument} on {Port}: attempt {Attempt} of {Attempts} of '{Command}' failed ({Reason}); trying again")]
    public static partial void Retrying(ILogger logger, string instrument, string port, int attempt, int attempts, string command, string reason);

    [LoggerMessage(EventId = 3004, Level = LogLevel.Information, Message = "{Instrument}: opened {Port} at {Baud} baud")]
    public static partial void Opened(ILogger logger, string instrument, string port, int baud);

    [LoggerMessage(EventId = 3005, Level = LogLevel.Warning, Message = "{Instrument}: lost {Port} ({Reason}); it is reopened on the next command")]
    public static partial void Lost(ILogger logger, string instrument, string port, string reason);

    [LoggerMessage(EventId = 3006, Level = LogLevel.Debug, Message = "{Instrument}: closed {Port}")]
    public static partial void Closed(ILogger logger, string instrument, string port);

    [LoggerMessage(EventId = 3010, Level = LogLevel.Debug, Message = "Scanner on {Port}: read '{Serial}'")]
    public static partial void Scanned(ILogger logger, string port, string serial);

    [LoggerMessage(EventId = 3011, Level = LogLevel.Warning, Message = "Scanner on {Port}: ignored {Problem}")]
    public static partial void ScanRejected(ILogger logger, string port, string problem);

    [LoggerMessage(EventId = 3050, Level = LogLevel.Debug, Message = "Twin {Instrument} on {Port}: received '{Command}', {Action}")]
    public static partial void TwinCommand(ILogger logger, string instrument, string port, string command, string action);

    [LoggerMessage(EventId = 3051, Level = LogLevel.Warning, Message = "Twin {Instrument} on {Port}: stopped after an error: {Reason}")]
    public static partial void TwinFailed(ILogger logger, string instrument, string port, string reason);
}
