namespace LineTest.Core.Definitions;

/// <summary>
/// One problem in a sequence or fixture file: where (file, line, JSON path) and why, in plain words.
/// </summary>
/// <param name="File">The file, as given by the caller.</param>
/// <param name="Line">1-based line, or null when the location is not in the file (e.g. a missing file).</param>
/// <param name="JsonPath">JSON path of the offending element, e.g. <c>$.steps[3].setpoint</c>.</param>
/// <param name="Reason">What is wrong, for a person.</param>
public sealed record DefinitionProblem(string File, int? Line, string JsonPath, string Reason)
{
    /// <summary>One line: <c>file:line: $.path: reason</c>.</summary>
    public override string ToString() =>
        Line is { } line ? $"{File}:{line}: {JsonPath}: {Reason}" : $"{File}: {JsonPath}: {Reason}";
}
