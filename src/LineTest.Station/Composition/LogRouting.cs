namespace LineTest.Station.Composition;

/// <summary>
/// Where log events go besides the log file, decided while the program runs: the console sink only while
/// <see cref="ConsoleOpen"/> (the live screen owns the terminal; <c>demo</c> prints unit lines), warnings and errors to
/// <see cref="ScreenMessage"/> while the console is closed, and every event stamped with <see cref="Clock"/> when set
/// (simulated time). Members may be changed from any thread.
/// </summary>
public sealed class LogRouting
{
    private volatile bool _consoleOpen = true;
    private volatile TimeProvider? _clock;
    private volatile Action<string>? _screenMessage;

    /// <summary>True (the default) when log events go to the console sinks of appsettings.json.</summary>
    public bool ConsoleOpen
    {
        get => _consoleOpen;
        set => _consoleOpen = value;
    }

    /// <summary>The clock events are stamped with (null: the time they were logged).</summary>
    public TimeProvider? Clock
    {
        get => _clock;
        set => _clock = value;
    }

    /// <summary>Receives the text of warnings and errors while the console is closed (null: nobody).</summary>
    public Action<string>? ScreenMessage
    {
        get => _screenMessage;
        set => _screenMessage = value;
    }
}
