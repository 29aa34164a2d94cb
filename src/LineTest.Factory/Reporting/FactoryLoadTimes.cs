namespace LineTest.Factory.Reporting;

/// <summary>
/// Where a factory report's load spent its time (wall time, each from the start of the load), for the benchmark. From
/// the packs: packs built, the last month's packs read and its runs ordered, everything placed. From the rows: runs
/// streamed, readings streamed and placed, and the yield count (which runs on its own connection meanwhile) received.
/// </summary>
public sealed class FactoryLoadTimes
{
    /// <summary>The packs of runs were brought up to date (<see cref="PacksWritten"/> written); zero when not asked.</summary>
    public TimeSpan PacksBuilt { get; internal set; }

    /// <summary>How many packs that wrote (none when they were current).</summary>
    public int PacksWritten { get; internal set; }

    /// <summary>True when the report was read from the packs, false when from the rows.</summary>
    public bool FromPacks { get; internal set; }

    /// <summary>The runs were read and indexed.</summary>
    public TimeSpan RunsRead { get; internal set; }

    /// <summary>The readings were streamed into per-series buckets.</summary>
    public TimeSpan ReadingsRead { get; internal set; }

    /// <summary>The buckets were sorted into run order and filled into the series.</summary>
    public TimeSpan ReadingsPlaced { get; internal set; }

    /// <summary>The yield count from SQL had arrived (zero when yield is not counted in SQL).</summary>
    public TimeSpan YieldCounted { get; internal set; }
}
