using System.Diagnostics.CodeAnalysis;

namespace LineTest.Core.Definitions;

/// <summary>The outcome of loading a definition file: the value, or every problem found.</summary>
/// <typeparam name="T">The definition type.</typeparam>
public sealed class LoadResult<T>
    where T : class
{
    private LoadResult(T? value, IReadOnlyList<DefinitionProblem> problems, string? sha256)
    {
        Value = value;
        Problems = problems;
        Sha256 = sha256;
    }

    /// <summary>The loaded definition, when there were no problems.</summary>
    public T? Value { get; }

    /// <summary>Every problem found (empty on success).</summary>
    public IReadOnlyList<DefinitionProblem> Problems { get; }

    /// <summary>SHA-256 of the file's bytes as lower-case hex, when the file could be read.</summary>
    public string? Sha256 { get; }

    /// <summary>True when the definition loaded without problems.</summary>
    [MemberNotNullWhen(true, nameof(Value), nameof(Sha256))]
    public bool IsSuccess => Value is not null && Problems.Count == 0;

    /// <summary>A successful result.</summary>
    public static LoadResult<T> Success(T value, string sha256) => new(value, [], sha256);

    /// <summary>A failed result with its problems.</summary>
    public static LoadResult<T> Failure(IReadOnlyList<DefinitionProblem> problems, string? sha256 = null) =>
        new(null, problems, sha256);
}
