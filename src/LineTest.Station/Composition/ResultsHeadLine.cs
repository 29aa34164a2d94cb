using LineTest.Storage.Proof;

namespace LineTest.Station.Composition;

/// <summary>
/// The line that tells the current head of a results folder, for the end-of-shift summary and reports: written down
/// elsewhere, it lets <c>linetest verify --expect-head SEQ:HASH</c> prove later that no run of the shift went missing.
/// </summary>
public static class ResultsHeadLine
{
    /// <summary>The current head of <paramref name="resultsFolder"/> as one line, or why there is none.</summary>
    public static string For(string resultsFolder)
    {
        var read = HeadFile.Read(resultsFolder);
        if (read.Head is { } head)
        {
            return $"Head {head.Current.Anchor} ({head.Current.Runs} runs): write it down; 'linetest verify --expect-head {head.Current.Anchor}' later proves none of them is missing";
        }

        return read.Problem is { } problem ? $"Head unreadable: {problem}" : $"Head: none yet ({HeadFile.PathIn(resultsFolder)} is written with the first stored run)";
    }
}
