namespace LineTest.Core.Trims;

/// <summary>
/// One problem of a trim spec: where, as a JSON path relative to the spec object (<c>gain.step</c>,
/// <c>coefficients[1].register</c>; empty for the spec itself), and why. A value, so the sequence checker places it
/// under the spec's own path without taking a message apart.
/// </summary>
/// <param name="Path">Relative JSON path, without a leading <c>$.</c> or dot; empty for the whole spec.</param>
/// <param name="Reason">What is wrong, for a person.</param>
public sealed record SpecProblem(string Path, string Reason)
{
    /// <summary>The problem as one line: <c>path: reason</c>.</summary>
    public override string ToString() => Path.Length == 0 ? Reason : $"{Path}: {Reason}";

    /// <summary>The problem moved under <paramref name="prefix"/> (e.g. <c>coefficients[0]</c>).</summary>
    public SpecProblem Under(string prefix) => this with { Path = Path.Length == 0 ? prefix : $"{prefix}.{Path}" };
}
