namespace LineTest.Core.Trims;

/// <summary>The standard part (or pair) chosen for one select-on-test position.</summary>
public sealed record ResistorChoice
{
    /// <summary>Board position, e.g. <c>R7</c>.</summary>
    public required string Position { get; init; }

    /// <summary>The exact value the trim asked for, ohms.</summary>
    public required double IdealOhms { get; init; }

    /// <summary>Single part, series pair or parallel pair.</summary>
    public required ResistorConnection Connection { get; init; }

    /// <summary>The part values, ohms: one for <see cref="ResistorConnection.Single"/>, else two (larger first).</summary>
    public required IReadOnlyList<double> Parts { get; init; }

    /// <summary>The series the parts come from.</summary>
    public required ESeries Series { get; init; }

    /// <summary>The resistance the fitted part(s) give, ohms.</summary>
    public double EffectiveOhms => Combine(Connection, Parts);

    /// <summary>Relative deviation of <see cref="EffectiveOhms"/> from <see cref="IdealOhms"/>.</summary>
    public double RelativeError => (EffectiveOhms / IdealOhms) - 1.0;

    /// <summary>The operator instruction, e.g. <c>Fit 12.1 kΩ (E96) in position R7</c>.</summary>
    public string Instruction
    {
        get
        {
            var digits = Series.SignificantDigits;
            return Connection switch
            {
                ResistorConnection.Single =>
                    $"Fit {ResistanceText.Format(Parts[0], digits)} ({Series.Name}) in position {Position}",
                ResistorConnection.Series =>
                    $"Fit {ResistanceText.Format(Parts[0], digits)} and {ResistanceText.Format(Parts[1], digits)} ({Series.Name}) in series in position {Position}",
                ResistorConnection.Parallel =>
                    $"Fit {ResistanceText.Format(Parts[0], digits)} and {ResistanceText.Format(Parts[1], digits)} ({Series.Name}) in parallel in position {Position}",
                _ => throw new InvalidOperationException($"Unknown connection {Connection}."),
            };
        }
    }

    /// <summary>The resistance of parts connected as given.</summary>
    public static double Combine(ResistorConnection connection, IReadOnlyList<double> parts)
    {
        ArgumentNullException.ThrowIfNull(parts);
        return connection switch
        {
            ResistorConnection.Single => parts[0],
            ResistorConnection.Series => parts[0] + parts[1],
            ResistorConnection.Parallel => parts[0] * parts[1] / (parts[0] + parts[1]),
            _ => throw new ArgumentOutOfRangeException(nameof(connection), connection, "Unknown connection."),
        };
    }
}
