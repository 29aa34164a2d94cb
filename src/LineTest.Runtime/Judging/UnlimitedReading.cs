using LineTest.Core.Decisions;
using LineTest.Core.Results;

namespace LineTest.Runtime.Judging;

/// <summary>Readings recorded without limits (for traceability and statistics); their verdict is pass.</summary>
internal static class UnlimitedReading
{
    public static Reading Create(string name, double value, string unit, ExpandedUncertainty? uncertainty = null) =>
        new(name, value, unit, null, null, Verdict.Pass)
        {
            StandardUncertainty = uncertainty?.StandardUncertainty,
            ExpandedUncertainty = uncertainty?.Expanded,
            CoverageFactor = uncertainty?.CoverageFactor,
        };
}
