using System.Globalization;
using System.Text;

namespace LineTest.Storage.Proof;

/// <summary>
/// <c>results.head</c> beside <c>results.db</c>: a small text file the station replaces atomically (temporary file,
/// flush, rename, flush the folder) at every write, holding the database state after and before that write
/// (<see cref="ResultsHead"/>). Copying, truncating or rolling back the database does not touch it, so
/// <c>linetest verify</c> can prove that no run is missing from the end.
/// </summary>
public static class HeadFile
{
    /// <summary>The head file's name inside the results folder.</summary>
    public const string FileName = "results.head";

    /// <summary>Heads set aside because the database no longer matched them are kept as <c>results.head.mismatch-N</c>.</summary>
    public const string MismatchPrefix = "results.head.mismatch-";

    private const string Magic = "linetest-head 1";

    /// <summary>The head file's full path in <paramref name="resultsFolder"/>.</summary>
    public static string PathIn(string resultsFolder) => Path.GetFullPath(Path.Combine(resultsFolder, FileName));

    /// <summary>Reads the head file of <paramref name="resultsFolder"/>.</summary>
    public static HeadRead Read(string resultsFolder) => ReadFile(PathIn(resultsFolder));

    /// <summary>Reads a head file at <paramref name="path"/>.</summary>
    public static HeadRead ReadFile(string path)
    {
        string text;
        try
        {
            if (!File.Exists(path))
            {
                return new HeadRead(false, null, null);
            }

            text = File.ReadAllText(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return new HeadRead(true, null, $"{path} cannot be read ({ex.Message})");
        }

        var head = Parse(text, out var problem);
        return new HeadRead(true, head, problem is null ? null : $"{path} is not a head file: {problem}");
    }

    /// <summary>The text of a head file.</summary>
    public static string Format(ResultsHead head)
    {
        ArgumentNullException.ThrowIfNull(head);
        var text = new StringBuilder();
        text.Append(Magic).Append('\n');
        AppendState(text, string.Empty, head.Current);
        if (head.Previous is { } previous)
        {
            AppendState(text, "previous-", previous);
        }

        return text.ToString();
    }

    /// <summary>Parses the text of a head file; null with a reason when it is not one.</summary>
    public static ResultsHead? Parse(string text, out string? problem)
    {
        ArgumentNullException.ThrowIfNull(text);
        var lines = text.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (lines.Length == 0 || lines[0] != Magic)
        {
            problem = $"its first line is not '{Magic}'";
            return null;
        }

        var current = ParseState(lines, string.Empty, out problem);
        if (current is null)
        {
            return null;
        }

        HeadState? previous = null;
        if (lines.Any(l => l.StartsWith("previous ", StringComparison.Ordinal)))
        {
            previous = ParseState(lines, "previous-", out problem);
            if (previous is null)
            {
                return null;
            }
        }

        return new ResultsHead(current, previous);
    }

    /// <summary>
    /// Replaces the head file atomically: writes <c>results.head.tmp</c>, flushes it, renames it over the head file and
    /// flushes the folder, so after a power cut the file is either the old head or the new one, whole.
    /// </summary>
    /// <exception cref="IOException">The head could not be written.</exception>
    internal static void Write(string resultsFolder, ResultsHead head)
    {
        var path = PathIn(resultsFolder);
        var temp = path + ".tmp";
        var bytes = Encoding.UTF8.GetBytes(Format(head));
        using (var stream = new FileStream(temp, FileMode.Create, FileAccess.Write, FileShare.None))
        {
            stream.Write(bytes);
            stream.Flush(flushToDisk: true);
        }

        File.Move(temp, path, overwrite: true);
        DirectorySync.Flush(Path.GetDirectoryName(path)!);
    }

    /// <summary>Moves the head file aside as <c>results.head.mismatch-N</c> (kept as evidence) and returns the new path.</summary>
    internal static string? SetAside(string resultsFolder)
    {
        var path = PathIn(resultsFolder);
        if (!File.Exists(path))
        {
            return null;
        }

        for (var n = 1; ; n++)
        {
            var aside = Path.Combine(Path.GetDirectoryName(path)!, MismatchPrefix + n.ToString(CultureInfo.InvariantCulture));
            if (!File.Exists(aside))
            {
                File.Move(path, aside);
                return aside;
            }
        }
    }

    private static void AppendState(StringBuilder text, string prefix, HeadState state)
    {
        var inv = CultureInfo.InvariantCulture;
        var headKey = prefix.Length == 0 ? "head" : "previous";
        text.Append(inv, $"{headKey} {state.Anchor}\n");
        text.Append(inv, $"{prefix}runs {state.Runs}\n");
        text.Append(inv, $"{prefix}releases {state.Releases} {state.ReleasesDigest}\n");
        foreach (var row in state.Journal)
        {
            text.Append(inv, $"{prefix}journal {row.Id} {row.Sha256}\n");
        }
    }

    private static HeadState? ParseState(string[] lines, string prefix, out string? problem)
    {
        var headKey = prefix.Length == 0 ? "head " : "previous ";
        var anchor = HeadState.ParseAnchor(Value(lines, headKey));
        if (anchor is null)
        {
            problem = $"no valid '{headKey}SEQ:HASH' line";
            return null;
        }

        if (!long.TryParse(Value(lines, prefix + "runs "), NumberStyles.None, CultureInfo.InvariantCulture, out var runs))
        {
            problem = $"no valid '{prefix}runs N' line";
            return null;
        }

        var releases = Value(lines, prefix + "releases ")?.Split(' ');
        if (releases is not { Length: 2 } || !long.TryParse(releases[0], NumberStyles.None, CultureInfo.InvariantCulture, out var releaseCount))
        {
            problem = $"no valid '{prefix}releases N DIGEST' line";
            return null;
        }

        var journal = new List<JournalProof>();
        foreach (var line in lines.Where(l => l.StartsWith(prefix + "journal ", StringComparison.Ordinal)))
        {
            var parts = line.Split(' ');
            if (parts.Length != 3)
            {
                problem = $"the line '{line}' is not '{prefix}journal ID HASH'";
                return null;
            }

            journal.Add(new JournalProof(parts[1], parts[2]));
        }

        problem = null;
        return new HeadState(anchor.Value.Seq, anchor.Value.Sha256, runs, releaseCount, releases[1], journal);
    }

    private static string? Value(string[] lines, string key) =>
        lines.FirstOrDefault(l => l.StartsWith(key, StringComparison.Ordinal)) is { } line ? line[key.Length..] : null;
}
