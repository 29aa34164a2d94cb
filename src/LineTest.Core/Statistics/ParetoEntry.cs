namespace LineTest.Core.Statistics;

/// <summary>One bar of a Pareto chart.</summary>
/// <param name="Name">What is counted: a reading name or an error reason.</param>
/// <param name="Count">How many runs.</param>
/// <param name="Fraction">Count over the total of all bars.</param>
/// <param name="CumulativeFraction">Running total of <see cref="Fraction"/> down to and including this bar.</param>
public sealed record ParetoEntry(string Name, int Count, double Fraction, double CumulativeFraction);
