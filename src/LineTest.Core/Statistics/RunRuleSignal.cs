namespace LineTest.Core.Statistics;

/// <summary>
/// One run-rule signal on a control chart.
/// </summary>
/// <param name="Family">Rule family.</param>
/// <param name="Rule">Rule number within the family (Western Electric 1–4, Nelson 1–8).</param>
/// <param name="Index">Index of the point at which the rule is first broken (the last point of the
/// shortest pattern that breaks it).</param>
/// <param name="Points">Indices, ascending, of the points that make up the pattern: for "k of m" rules the
/// k or more points beyond the zone; for run rules the whole maximal run (one signal per run, however long).</param>
/// <param name="Description">Plain statement of the rule.</param>
public sealed record RunRuleSignal(RunRuleFamily Family, int Rule, int Index, IReadOnlyList<int> Points, string Description);
