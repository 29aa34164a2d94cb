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
}
