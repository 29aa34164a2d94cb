using System.Collections.Concurrent;
using Microsoft.Extensions.Logging;

namespace LineTest.Factory.Tests.Support;

/// <summary>A logger that keeps every event (id and formatted message) for the test to read.</summary>
public sealed class RecordingLogger<T> : ILogger<T>
{
    public ConcurrentQueue<(EventId Id, LogLevel Level, string Message)> Events { get; } = new();

    public IDisposable? BeginScope<TState>(TState state)
        where TState : notnull => null;

    public bool IsEnabled(LogLevel logLevel) => true;

    public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter) =>
        Events.Enqueue((eventId, logLevel, formatter(state, exception)));
}
