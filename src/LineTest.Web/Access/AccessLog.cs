using Microsoft.Extensions.Logging;

namespace LineTest.Web.Access;

/// <summary>Log events of the live page (event ids 4000–4099): who looked at what, refusals, start and stop.</summary>
internal static partial class AccessLog
{
    [LoggerMessage(EventId = 4000, Level = LogLevel.Information, Message = "Page {Path} viewed by {Who} from {Remote}")]
    public static partial void Viewed(ILogger logger, string path, string who, string remote);

    [LoggerMessage(EventId = 4001, Level = LogLevel.Warning, Message = "Request for {Path} from {Remote} refused: {Reason}")]
    public static partial void Refused(ILogger logger, string path, string remote, string reason);

    [LoggerMessage(EventId = 4002, Level = LogLevel.Information, Message = "Live page listening on {Address}, reading {Source}; credential required from other computers: {Guarded}")]
    public static partial void Listening(ILogger logger, string address, string source, bool guarded);

    [LoggerMessage(EventId = 4003, Level = LogLevel.Warning, Message = "The results could not be read for {Path}: {Reason}")]
    public static partial void ReadFailed(ILogger logger, string path, string reason);
}
