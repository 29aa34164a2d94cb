namespace LineTest.Station.Campaign;

/// <summary>
/// What a fuzz run found. Must be zero: <see cref="LoaderCrashes"/>, <see cref="ProblemsWithoutLocation"/>,
/// <see cref="UnhandledInBatches"/> and <see cref="UnitsWithoutVerdict"/>.
/// </summary>
public sealed record FuzzSummary
{
    /// <summary>Damaged sequence and fixture files loaded.</summary>
    public required int LoaderCases { get; init; }

    /// <summary>Damaged files that still loaded (the damage did not matter, e.g. a flipped byte in a description).</summary>
    public required int Loaded { get; init; }

    /// <summary>Damaged files refused with problems.</summary>
    public required int Refused { get; init; }

    /// <summary>Loads that threw instead of returning problems.</summary>
    public required int LoaderCrashes { get; init; }

    /// <summary>Problems reported without a line or JSON path.</summary>
    public required int ProblemsWithoutLocation { get; init; }

    /// <summary>Batches run on instruments that reply with garbage.</summary>
    public required int GarbageBatches { get; init; }

    /// <summary>Garbage replies given.</summary>
    public required int GarbageReplies { get; init; }

    /// <summary>Units tested on garbage instruments, and their verdicts.</summary>
    public required int Units { get; init; }

    /// <summary>Units that passed on garbage instruments.</summary>
    public required int Pass { get; init; }

    /// <summary>Units that failed.</summary>
    public required int Fail { get; init; }

    /// <summary>Units in error.</summary>
    public required int Error { get; init; }

    /// <summary>Batches that ended in an exception instead of verdicts.</summary>
    public required int UnhandledInBatches { get; init; }

    /// <summary>Units that ended without pass, fail or error.</summary>
    public required int UnitsWithoutVerdict { get; init; }

    /// <summary>Units passed on garbage instruments that the simulator knows are out of limits.</summary>
    public required int WrongPasses { get; init; }

    /// <summary>
    /// Units on garbage instruments whose run holds readings of a trim step: the garbage batches got that far (an
    /// instrument the garbage wrapper forgot would stop every batch earlier and leave this at zero).
    /// </summary>
    public int ReachedTrim { get; init; }

    /// <summary>Units on garbage instruments whose run holds readings of a verify step.</summary>
    public int ReachedVerify { get; init; }

    /// <summary>The first few crash messages, for the bug report.</summary>
    public required IReadOnlyList<string> FirstCrashes { get; init; }

    /// <summary>Wall-clock seconds.</summary>
    public required double WallSeconds { get; init; }
}
