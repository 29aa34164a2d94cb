namespace LineTest.Reports.Building;

/// <summary>Yield of the runs that ended on one UTC day.</summary>
/// <param name="Day">The day, yyyy-MM-dd.</param>
/// <param name="Runs">Runs that ended that day.</param>
/// <param name="FirstPassYield">First-pass yield of the units tested that day (0…1).</param>
/// <param name="FinalYield">Final yield of the units tested that day (0…1).</param>
public sealed record DailyYield(string Day, int Runs, double? FirstPassYield, double? FinalYield);
