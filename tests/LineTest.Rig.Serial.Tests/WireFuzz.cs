using CsCheck;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests;

/// <summary>
/// Generators for fuzzing the serial parsers: random lines built from the tokens the protocols use (so that random
/// input reaches deep into every grammar), random characters of every kind, and valid replies with one mutation.
/// </summary>
internal static class WireFuzz
{
    /// <summary>How many lines each parser property draws; the parsers are cheap, so this is plenty in well under a second.</summary>
    public const long Iterations = 20_000;

    // Protocol keywords and number pieces, plus characters a parser could mistake for them: NUL and other control
    // characters, no-break space, non-ASCII digits (Arabic-Indic, full-width), the infinity sign and the names .NET
    // parses as special values.
    private static readonly string[] Tokens =
    [
        "0", "1", "7", "9", "12", "255", "-", "+", ".", "e", "E", "E+", "E-", "E16", ",", " ", "  ", "\t", "*", "=", "\"", ";", ":",
        "OK", "ERR ", "ERR", "FAULT ", "FAULT", "OHM", "MV", "CEL", "ID ", "RAW ", "TEMP ", "TRIM ", "GAIN", "OFS_2", "A", "Z", "F", "a",
        "(@1)", "+0", "-113", "No error", "Infinity", "-Infinity", "infinity", "NaN", "nan", "\u221E", "1E400", "1e-400", "9.9E37",
        "99999999999999999999", "9223372036854775808", "2147483648", "0x1F", "1_000", "\0", "\r", "\n", "\v", "\f", "\u0085",
        "\u00A0", "\u2007", "\u00E9", "\u0661", "\uFF11", "\uFFFD", "\uD800",
    ];

    /// <summary>Any character at all, including unpaired surrogates.</summary>
    public static Gen<char> AnyChar { get; } = Gen.Char;

    /// <summary>A random line of protocol tokens and random characters, 0 to 16 pieces.</summary>
    public static Gen<string> Line { get; } = Gen.Frequency(
            (4, Gen.OneOf(Tokens)),
            (1, AnyChar.Select(c => c.ToString())),
            (1, Gen.Char[' ', '~'].Select(c => c.ToString())))
        .Array[0, 16]
        .Select(string.Concat);

    /// <summary>A random line of printable ASCII only (what the line reader lets through).</summary>
    public static Gen<string> PrintableLine { get; } = Gen.String[Gen.Char[' ', '~'], 0, 48];

    /// <summary>A finite double of any magnitude, sign and precision.</summary>
    public static Gen<double> FiniteDouble { get; } = Gen.Frequency(
        (3, Gen.Double.Where(double.IsFinite)),
        (3, Gen.Double[-1000, 1000]),
        (1, Gen.OneOf(0.0, -0.0, double.Epsilon, -double.Epsilon, double.MaxValue, double.MinValue, 1e-300, 9.9e37)));

    /// <summary>One random edit of <paramref name="valid"/>: a character replaced, inserted, deleted, a token inserted, a cut, or a doubling.</summary>
    public static Gen<string> Mutated(Gen<string> valid) =>
        Gen.Select(valid, Gen.Int[0, 5], Gen.Int[0, 1000], AnyChar, Gen.OneOf(Tokens), (line, edit, at, c, token) =>
            {
                var i = line.Length == 0 ? 0 : at % (line.Length + 1);
                return edit switch
                {
                    0 when i < line.Length => string.Concat(line.AsSpan(0, i), c.ToString(), line.AsSpan(i + 1)),
                    1 => line.Insert(i, c.ToString()),
                    2 when i < line.Length => line.Remove(i, 1),
                    3 => line.Insert(i, token),
                    4 => line[..i],
                    _ => line + line,
                };
            });

    /// <summary>Random lines and mutated valid ones, half and half.</summary>
    public static Gen<string> LinesAround(Gen<string> valid) => Gen.OneOf(Line, Mutated(valid), Mutated(Mutated(valid)));

    /// <summary>
    /// Checks that <paramref name="parse"/> never throws and says exactly what <paramref name="expected"/> (the
    /// protocol written out independently in <see cref="ProtocolGrammar"/>) says of every line: the same value for a
    /// valid reply, the same instrument error, and garbage for everything else.
    /// </summary>
    public static void MatchesGrammar<T>(Gen<string> lines, Func<string, ReplyParse<T>> parse, Func<string, Expected<T>> expected, Func<T, T, bool>? same = null)
    {
        same ??= (a, b) => EqualityComparer<T>.Default.Equals(a, b);
        lines.Sample(line =>
        {
            ReplyParse<T> parsed;
            try
            {
                parsed = parse(line);
            }
            catch (Exception ex)
            {
                throw new InvalidOperationException($"parser threw {ex.GetType().Name} on {Show(line)}: {ex.Message}", ex);
            }

            var want = expected(line);
            var ok = want.Kind switch
            {
                ExpectedKind.Value => parsed.IsOk && same(parsed.Value!, want.Value!),
                ExpectedKind.InstrumentError => parsed.InstrumentError == want.Error && parsed.Garbage is null,
                _ => parsed.Garbage is { Length: > 0 } && parsed.InstrumentError is null,
            };
            Assert.True(ok, $"{Show(line)}: expected {want}, parsed value '{parsed.Value}', garbage '{parsed.Garbage}', error '{parsed.InstrumentError}'");
        }, iter: Iterations, print: Show);
    }

    /// <summary>A line with every character outside printable ASCII shown as <c>\uXXXX</c>, for failure messages.</summary>
    public static string Show(string line) =>
        "\"" + string.Concat(line.Select(c => c is >= ' ' and <= '~' ? c.ToString() : $"\\u{(int)c:X4}")) + "\"";
}
