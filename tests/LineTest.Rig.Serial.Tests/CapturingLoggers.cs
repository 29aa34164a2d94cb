using System.Collections.Concurrent;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Tests;

/// <summary>A logger factory that keeps every warning and error, so a failing test can say what the twins saw.</summary>
internal sealed class CapturingLoggers : ILoggerFactory
{
    public ConcurrentQueue<string> Lines { get; } = new();

    public void AddProvider(ILoggerProvider provider)
    {
    }

    public ILogger CreateLogger(string categoryName) => new Logger(Lines);

    public void Dispose()
    {
    }

    private sealed class Logger(ConcurrentQueue<string> lines) : ILogger
    {
        public IDisposable? BeginScope<TState>(TState state)
            where TState : notnull => null;

        public bool IsEnabled(LogLevel logLevel) => logLevel >= LogLevel.Warning;

        public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter)
        {
            if (IsEnabled(logLevel))
            {
                lines.Enqueue($"{eventId.Id} {formatter(state, exception)} {exception}");
            }
        }
    }
}
