namespace LineTest.Core.Statistics;

/// <summary>Which published set of run rules a signal comes from.</summary>
public enum RunRuleFamily
{
    /// <summary>Western Electric Statistical Quality Control Handbook (1956) zone rules 1–4.</summary>
    WesternElectric,

    /// <summary>Nelson (1984), Journal of Quality Technology 16(4), rules 1–8.</summary>
    Nelson,
}
