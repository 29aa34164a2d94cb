namespace LineTest.Reports.Loading;

/// <summary>How a report splits its runs into groups (the <c>--by</c> option).</summary>
public enum ReportGrouping
{
    /// <summary>No grouping: one report over all runs.</summary>
    None,

    /// <summary>By station id.</summary>
    Station,

    /// <summary>By slot number.</summary>
    Slot,

    /// <summary>By production lot.</summary>
    Lot,

    /// <summary>By the UTC calendar day on which a run ended.</summary>
    Day,

    /// <summary>By sequence id and revision.</summary>
    Revision,

    /// <summary>By the operator stored with the run.</summary>
    Operator,

    /// <summary>By the shift (from the station's shift calendar) in which a run ended.</summary>
    Shift,
}
