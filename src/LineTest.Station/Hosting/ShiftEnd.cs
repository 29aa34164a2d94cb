namespace LineTest.Station.Hosting;

/// <summary>How a shift at the hosted station ended.</summary>
public enum ShiftEnd
{
    /// <summary><c>quit</c>, or the end of keyboard input after the last batch.</summary>
    Done,

    /// <summary>Ctrl-C, confirmed during a batch (exit 130).</summary>
    Interrupted,

    /// <summary>SIGTERM (exit 143).</summary>
    Terminated,
}
