namespace LineTest.Factory.Verification;

/// <summary>The check of one station database's chain as the factory holds it.</summary>
/// <param name="ChainId">The chain (the station database's id).</param>
/// <param name="Station">Station id.</param>
/// <param name="RunsChecked">Runs walked.</param>
/// <param name="HeadSeq">The station seq of the last run held.</param>
/// <param name="HeadSha256">Its record hash (the value to compare with the station's <c>results.head</c>).</param>
/// <param name="FirstProblem">The first problem, or null when intact.</param>
public sealed record ChainCheck(Guid ChainId, string Station, long RunsChecked, long HeadSeq, string HeadSha256, FactoryProblem? FirstProblem)
{
    /// <summary>True when nothing was found wrong.</summary>
    public bool IsIntact => FirstProblem is null;
}
