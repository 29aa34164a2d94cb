namespace LineTest.Station.Cli;

/// <summary>Process exit codes: a contract with scripts and other tools.</summary>
public static class ExitCodes
{
    /// <summary>Done.</summary>
    public const int Done = 0;

    /// <summary>Failed at run time (instrument lost, results could not be stored, a unit or check not usable).</summary>
    public const int RuntimeFailure = 1;

    /// <summary>Bad arguments or bad input files.</summary>
    public const int BadInput = 2;

    /// <summary>Stopped by Ctrl-C (SIGINT), confirmed during a batch: 128 + 2, as shells report it.</summary>
    public const int Interrupted = 130;

    /// <summary>Stopped by SIGTERM (a service manager or <c>kill</c>): 128 + 15.</summary>
    public const int Terminated = 143;
}
