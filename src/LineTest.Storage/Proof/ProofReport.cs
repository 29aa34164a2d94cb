using LineTest.Storage.Chain;

namespace LineTest.Storage.Proof;

/// <summary>The outcome of <see cref="ProofVerifier"/>: the hash chain, the database against its head, and notes.</summary>
/// <param name="Chain">The hash chain check (every changed, inserted or deleted run).</param>
/// <param name="Database">What the database holds now, as a head would record it.</param>
/// <param name="IssuedSeq">The highest seq the database ever gave a run (<c>sqlite_sequence</c>).</param>
/// <param name="Head">The head file as read.</param>
/// <param name="Problems">Every problem found beyond the chain.</param>
/// <param name="Notes">Facts worth knowing that are not problems (e.g. the last write did not commit).</param>
public sealed record ProofReport(
    ChainReport Chain, HeadState Database, long IssuedSeq, HeadRead Head, IReadOnlyList<ProofProblem> Problems, IReadOnlyList<string> Notes)
{
    /// <summary>True when the chain is intact and nothing disagrees with the head, the seq counter or the expected anchor.</summary>
    public bool IsIntact => Chain.IsIntact && Problems.Count == 0;

    /// <summary>How many problems in all (chain and proof).</summary>
    public long ProblemCount => Chain.ProblemCount + Problems.Count;

    /// <summary>Every problem as one line, chain problems first.</summary>
    public IEnumerable<string> ProblemLines() =>
        Chain.Problems.Select(p => $"{p.Kind} at seq {p.Seq}{(p.RunId is { } id ? $" (run {id})" : string.Empty)}: {p.Message}")
            .Concat(Problems.Select(p => $"{p.Kind}: {p.Message}"));
}
