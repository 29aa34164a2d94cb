using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Station.Demo;

/// <summary>What a simulated shift runs.</summary>
public sealed record ShiftOptions
{
    /// <summary>The checked fixture (must be a simulator fixture).</summary>
    public required FixtureDefinition Fixture { get; init; }

    /// <summary>The checked sequence.</summary>
    public required SequenceDefinition Sequence { get; init; }

    /// <summary>SHA-256 of the sequence file.</summary>
    public required string SequenceSha256 { get; init; }

    /// <summary>Units to test.</summary>
    public int Units { get; init; } = 48;

    /// <summary>Slots used per batch (at most the fixture's).</summary>
    public int Slots { get; init; } = 4;

    /// <summary>Simulator seed.</summary>
    public int Seed { get; init; } = 4040;

    /// <summary>
    /// Counter of the first serial (1…999999) when the folder holds none of the product yet and <see cref="FirstSerial"/>
    /// is not given: stations of one demo draw serials from separate blocks.
    /// </summary>
    public int FirstSerialCounter { get; init; } = 1;

    /// <summary>Results folder.</summary>
    public required string ResultsDirectory { get; init; }

    /// <summary>Station id.</summary>
    public string Station { get; init; } = "ST-01";

    /// <summary>Lot stored with every run.</summary>
    public string? Lot { get; init; }

    /// <summary>Operator stored with every run.</summary>
    public string? Operator { get; init; } = "simulated operator";

    /// <summary>
    /// When true the coordinator reaches the simulated instruments through the real serial drivers, over
    /// pseudo-terminal ports (Linux only); verdicts are the same as without.
    /// </summary>
    public bool Serial { get; init; }

    /// <summary><c>engineering</c> (default) or <c>production</c>; stored with every run. Production runs only a released sequence file.</summary>
    public string Mode { get; init; } = "engineering";

    /// <summary>The sequence file's path, named in a production refusal.</summary>
    public string SequenceFile { get; init; } = "sequence";

    /// <summary>Receives lines for the person watching (recovered runs at start-up), or null.</summary>
    public Action<string>? Notice { get; init; }

    /// <summary>
    /// Called with the shift's virtual clock when the stored pass starts, so that log events can carry its time
    /// (null: nobody asks).
    /// </summary>
    public Action<TimeProvider>? ClockStarted { get; init; }

    /// <summary>Virtual seconds the operator takes to unload one batch and load the next.</summary>
    public double ReloadSeconds { get; init; } = 30;

    /// <summary>
    /// Counter of the first serial (the NNNNNN of CTP40A-YYWW-NNNNNN); null continues after the highest serial of the
    /// product already stored in the folder (1 in an empty folder).
    /// </summary>
    public int? FirstSerial { get; init; }

    /// <summary>
    /// The clock that says what "now" is. The shift starts after the last run already stored (06:00 UTC a week ago in
    /// an empty folder) and must end no later than now, so no run is stored in the future and two shifts in one folder
    /// do not interleave.
    /// </summary>
    public TimeProvider Clock { get; init; } = TimeProvider.System;
}
