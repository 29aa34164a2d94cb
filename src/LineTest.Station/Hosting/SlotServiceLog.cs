using System.Text.Json;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Hosting;

/// <summary>
/// Records slots taken out of service and put back, with the operator and the time: one JSON line per change in
/// <c>slot-service.jsonl</c> beside the results database (flushed to disk), and a log event.
/// </summary>
public sealed partial class SlotServiceLog
{
    /// <summary>The file name in the results folder.</summary>
    public const string FileName = "slot-service.jsonl";

    private readonly string _path;
    private readonly string _station;
    private readonly ILogger _logger;

    /// <summary>A log in <paramref name="resultsDirectory"/> for <paramref name="station"/>.</summary>
    public SlotServiceLog(string resultsDirectory, string station, ILogger logger)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsDirectory);
        _path = Path.Combine(resultsDirectory, FileName);
        _station = station;
        _logger = logger;
    }

    /// <summary>The file.</summary>
    public string FilePath => _path;

    /// <summary>Records one change.</summary>
    public void Record(int slot, bool inService, string? reason, string? operatorName, DateTimeOffset atUtc)
    {
        var line = JsonSerializer.Serialize(new
        {
            atUtc = atUtc.UtcDateTime.ToString("O", System.Globalization.CultureInfo.InvariantCulture),
            station = _station,
            slot,
            inService,
            reason,
            @operator = operatorName,
        });
        try
        {
            Directory.CreateDirectory(Path.GetDirectoryName(_path)!);
            using var file = new FileStream(_path, FileMode.Append, FileAccess.Write, FileShare.ReadWrite);
            using var writer = new StreamWriter(file);
            writer.WriteLine(line);
            writer.Flush();
            file.Flush(flushToDisk: true);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // Diagnostics never stop the station: the log event below still records it.
            LogNotWritten(_logger, _path, ex.Message);
        }

        LogChanged(_logger, slot, inService ? "in service" : "out of service", reason ?? string.Empty, operatorName ?? "-");
    }

    [LoggerMessage(EventId = 2022, Level = LogLevel.Warning, Message = "Slot {Slot} {Change} {Reason} (operator {Operator})")]
    private static partial void LogChanged(ILogger logger, int slot, string change, string reason, string @operator);

    [LoggerMessage(EventId = 2023, Level = LogLevel.Warning, Message = "The slot service record {Path} could not be written: {Reason}")]
    private static partial void LogNotWritten(ILogger logger, string path, string reason);
}
