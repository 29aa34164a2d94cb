namespace LineTest.Storage.Chain;

/// <summary>The outcome of checking a results database's hash chain.</summary>
/// <param name="RunsChecked">Runs that were found intact before the first problem (all runs when intact).</param>
/// <param name="HeadSha256">The record hash of the last intact run (<see cref="RecordHash.Genesis"/> for an empty database).
/// Writing this down elsewhere (a shift report) lets a later check prove that no run was removed from the end.</param>
/// <param name="FirstProblem">The first problem found, or null when the chain is intact (<see cref="Problems"/> has them all).</param>
public sealed record ChainReport(long RunsChecked, string HeadSha256, ChainProblem? FirstProblem)
{
    /// <summary>How many problems are kept in <see cref="Problems"/>; <see cref="ProblemCount"/> counts them all.</summary>
    public const int ProblemListLimit = 1000;

    /// <summary>True when every run, its hash link and its readings agree.</summary>
    public bool IsIntact => FirstProblem is null;

    /// <summary>Every problem found, in the order found (at most <see cref="ProblemListLimit"/>).</summary>
    public IReadOnlyList<ChainProblem> Problems { get; init; } = FirstProblem is null ? [] : [FirstProblem];

    /// <summary>How many problems were found in all.</summary>
    public long ProblemCount { get; init; } = FirstProblem is null ? 0 : 1;
}
