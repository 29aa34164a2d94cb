namespace LineTest.Core.Definitions;

/// <summary>A parsed definition file, before semantic checks.</summary>
/// <param name="Value">The value, or null when parsing failed.</param>
/// <param name="Problems">Syntax and type problems.</param>
/// <param name="Sha256">SHA-256 of the bytes, when read.</param>
/// <param name="Locator">Maps JSON paths to lines for later checks.</param>
public sealed record ParsedDefinition<T>(T? Value, IReadOnlyList<DefinitionProblem> Problems, string? Sha256, JsonLocator Locator)
    where T : class
{
    /// <summary>
    /// When the file has problems but its text could be read: the value with every broken part repaired (a placeholder
    /// or the default), for the semantic checks of the parts that parsed; null when nothing could be salvaged.
    /// </summary>
    public T? Salvaged { get; init; }

    /// <summary>Paths whose value in <see cref="Salvaged"/> is a placeholder or a default, not what the file says.</summary>
    public IReadOnlyList<string> BrokenPaths { get; init; } = [];

    /// <summary>
    /// Every problem of the file: its own (<see cref="Problems"/>) and the semantic ones found by
    /// <paramref name="check"/> that do not depend on a broken part (<see cref="DependentProblems"/>), in file order;
    /// the value when there are none.
    /// </summary>
    /// <param name="file">File name used in problems.</param>
    /// <param name="check">The semantic checks.</param>
    /// <param name="reads">Which regions each region's checks read.</param>
    public LoadResult<T> Finish(string file, Func<T, ProblemList> check, IReadOnlyDictionary<string, string[]> reads)
    {
        ArgumentNullException.ThrowIfNull(check);
        if (Value is not null && Problems.Count == 0)
        {
            var semantic = check(Value).Locate(file, Locator);
            return semantic.Count == 0 ? LoadResult<T>.Success(Value, Sha256!) : LoadResult<T>.Failure(semantic, Sha256);
        }

        if (Salvaged is null)
        {
            return LoadResult<T>.Failure(Problems, Sha256);
        }

        var standing = new ProblemList();
        foreach (var (path, reason) in DependentProblems.Standing(check(Salvaged).Items, BrokenPaths, reads))
        {
            standing.Add(path, reason);
        }

        return LoadResult<T>.Failure([.. Problems.Concat(standing.Locate(file, Locator)).OrderBy(p => p.Line ?? 0)], Sha256);
    }
}
