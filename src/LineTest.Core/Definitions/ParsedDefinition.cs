namespace LineTest.Core.Definitions;

/// <summary>A parsed definition file, before semantic checks.</summary>
/// <param name="Value">The value, or null when parsing failed.</param>
/// <param name="Problems">Syntax and type problems.</param>
/// <param name="Sha256">SHA-256 of the bytes, when read.</param>
/// <param name="Locator">Maps JSON paths to lines for later checks.</param>
public sealed record ParsedDefinition<T>(T? Value, IReadOnlyList<DefinitionProblem> Problems, string? Sha256, JsonLocator Locator)
    where T : class;
