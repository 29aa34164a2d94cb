namespace LineTest.Station.Campaign;

/// <summary>What a file fuzz run found: <see cref="Crashes"/> and <see cref="OverTenSeconds"/> must be zero.</summary>
public sealed record FileFuzzSummary
{
    /// <summary>Damaged sequence files checked.</summary>
    public required int Sequences { get; init; }

    /// <summary>Damaged fixture files checked.</summary>
    public required int Fixtures { get; init; }

    /// <summary>Damaged files that still loaded.</summary>
    public required int Loaded { get; init; }

    /// <summary>Damaged files refused with located problems (what <c>check</c> exits 2 with).</summary>
    public required int Refused { get; init; }

    /// <summary>Checks that threw instead of returning problems.</summary>
    public required int Crashes { get; init; }

    /// <summary>Checks that took more than 10 s.</summary>
    public required int OverTenSeconds { get; init; }

    /// <summary>The slowest check, milliseconds.</summary>
    public required double SlowestMilliseconds { get; init; }

    /// <summary>The first few crash messages, for the bug report.</summary>
    public required IReadOnlyList<string> FirstCrashes { get; init; }

    /// <summary>Wall-clock seconds.</summary>
    public required double WallSeconds { get; init; }
}
