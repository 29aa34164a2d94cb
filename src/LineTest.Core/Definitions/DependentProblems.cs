namespace LineTest.Core.Definitions;

/// <summary>
/// Decides which semantic problems of a repaired document (<see cref="ShapeRepair"/>) still stand. A file is split into
/// regions, its top-level keys (<c>$.stability</c>, <c>$.steps</c>); each checker states which regions the checks that
/// report in a region read (<c>Reads</c>: region → other regions; a region always reads itself; a region missing from
/// the table reads everything). A problem is dropped when a region it reads holds a broken value; inside one list
/// (<c>$.steps[i]</c>) only the entries from the broken one on are dropped, since an entry is checked against the ones
/// before it. An unknown key counts as broken where it stands (it was meant to set something, and a default stands in).
/// </summary>
public static class DependentProblems
{
    /// <summary>Marks a region that reads every other region.</summary>
    public const string Everything = "*";

    /// <summary>The problems of <paramref name="semantic"/> that do not depend on a repaired part.</summary>
    /// <param name="semantic">Problems the semantic checks found on the repaired document.</param>
    /// <param name="brokenPaths">Paths whose value was replaced or removed.</param>
    /// <param name="reads">Region → the other regions its checks read.</param>
    public static IEnumerable<(string Path, string Reason)> Standing(
        IEnumerable<(string Path, string Reason)> semantic,
        IReadOnlyCollection<string> brokenPaths,
        IReadOnlyDictionary<string, string[]> reads)
    {
        ArgumentNullException.ThrowIfNull(semantic);
        ArgumentNullException.ThrowIfNull(brokenPaths);
        ArgumentNullException.ThrowIfNull(reads);
        var broken = brokenPaths.Select(Region).ToList();
        return semantic.Where(p => !DependsOnBroken(Region(p.Path), broken, reads));
    }

    /// <summary>The region of a JSON path: its top-level key (empty for <c>$</c> itself) and the index after it, if any.</summary>
    public static (string Key, int? Index) Region(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        if (!path.StartsWith("$", StringComparison.Ordinal) || path.Length == 1)
        {
            return (string.Empty, null);
        }

        string key;
        int rest;
        if (path[1] == '.')
        {
            var end = path.IndexOfAny(['.', '['], 2);
            end = end < 0 ? path.Length : end;
            key = path[2..end];
            rest = end;
        }
        else if (path.StartsWith("$['", StringComparison.Ordinal) && path.IndexOf("']", 3, StringComparison.Ordinal) is var close and > 0)
        {
            key = path[3..close].Replace("\\'", "'", StringComparison.Ordinal);
            rest = close + 2;
        }
        else
        {
            return (string.Empty, null);
        }

        if (rest < path.Length && path[rest] == '[' && path.IndexOf(']', rest) is var bracket and > 0
            && int.TryParse(path.AsSpan(rest + 1, bracket - rest - 1), System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var index))
        {
            return (key, index);
        }

        return (key, null);
    }

    private static bool DependsOnBroken((string Key, int? Index) problem, List<(string Key, int? Index)> broken, IReadOnlyDictionary<string, string[]> reads)
    {
        var known = reads.TryGetValue(problem.Key, out var others);
        foreach (var b in broken)
        {
            if (b.Key.Length == 0)
            {
                return true;
            }

            if (b.Key == problem.Key)
            {
                // The same list: entries before the broken one do not read it; the list as a whole (its length) is
                // unchanged, since a broken entry is replaced in place.
                if (b.Index is null || (problem.Index is { } at && at >= b.Index))
                {
                    return true;
                }
            }
            else if (!known || others!.Contains(Everything, StringComparer.Ordinal) || others.Contains(b.Key, StringComparer.Ordinal))
            {
                return true;
            }
        }

        return false;
    }
}
