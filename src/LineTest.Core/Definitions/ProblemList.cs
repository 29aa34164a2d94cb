namespace LineTest.Core.Definitions;

/// <summary>Collects (JSON path, reason) pairs during a semantic check.</summary>
public sealed class ProblemList
{
    private readonly List<(string Path, string Reason)> _items = [];

    /// <summary>Everything found so far.</summary>
    public IReadOnlyList<(string Path, string Reason)> Items => _items;

    /// <summary>Adds a problem at <paramref name="path"/>.</summary>
    public void Add(string path, string reason) => _items.Add((path, reason));

    /// <summary>Adds a problem when <paramref name="condition"/> is true.</summary>
    public void AddIf(bool condition, string path, string reason)
    {
        if (condition)
        {
            _items.Add((path, reason));
        }
    }

    /// <summary>
    /// Turns the collected problems into located <see cref="DefinitionProblem"/>s, in file order (the checks run
    /// in their own order; an engineer fixes a file from top to bottom). Problems on one line keep their order.
    /// </summary>
    public IReadOnlyList<DefinitionProblem> Locate(string file, JsonLocator locator)
    {
        ArgumentNullException.ThrowIfNull(locator);
        return _items
            .Select(p => new DefinitionProblem(file, locator.LineOf(p.Path), p.Path, p.Reason))
            .OrderBy(p => p.Line ?? 0)
            .ToList();
    }
}
