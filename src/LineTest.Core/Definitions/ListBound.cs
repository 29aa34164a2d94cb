namespace LineTest.Core.Definitions;

/// <summary>
/// The bound on a list in a definition file: how few items it may have and whether an item may repeat. Written into
/// the JSON Schema as <c>minItems</c> and <c>uniqueItems</c>; <c>check</c> judges the same with a reason of the list's
/// own (e.g. <see cref="Sequences.Steps.TrimStepKind"/>), since what is allowed can depend on other fields.
/// </summary>
/// <param name="MinItems">Fewest items.</param>
/// <param name="Unique">Whether every item must differ.</param>
public sealed record ListBound(int MinItems, bool Unique)
{
    /// <summary>The bound in words, for the schema's description.</summary>
    public string Describe() => Unique ? $"at least {MinItems} different items" : $"at least {MinItems} items";
}
