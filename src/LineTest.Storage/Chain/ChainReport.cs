namespace LineTest.Storage.Chain;

/// <summary>The outcome of checking a results database's hash chain.</summary>
/// <param name="RunsChecked">Runs that were found intact before the first problem (all runs when intact).</param>
/// <param name="HeadSha256">The record hash of the last intact run (<see cref="RecordHash.Genesis"/> for an empty database).
/// Writing this down elsewhere (a shift report) lets a later check prove that no run was removed from the end.</param>
/// <param name="FirstProblem">The first problem found, or null when the chain is intact.</param>
public sealed record ChainReport(long RunsChecked, string HeadSha256, ChainProblem? FirstProblem)
{
    /// <summary>True when every run, its hash link and its readings agree.</summary>
    public bool IsIntact => FirstProblem is null;
}
