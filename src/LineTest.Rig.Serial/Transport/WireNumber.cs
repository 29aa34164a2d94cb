using System.Globalization;

namespace LineTest.Rig.Serial.Transport;

/// <summary>
/// Numbers as the serial protocols write them, read strictly. <see cref="double.TryParse(string?, NumberStyles, IFormatProvider?, out double)"/>
/// alone is too lenient for a wire: it also takes the names <c>Infinity</c> and <c>NaN</c>, the sign <c>∞</c>, line
/// breaks and other white space around the number, and trailing NUL characters, so that a garbled reply could pass for a
/// plausible value. Here only ASCII digits, sign, decimal point and exponent count, with blanks (space, TAB) around.
/// </summary>
public static class WireNumber
{
    /// <summary>
    /// Reads a decimal number: optional blanks, an optional sign, digits with an optional decimal point (or a point and
    /// digits), an optional exponent (<c>e</c>/<c>E</c>, optional sign, digits), optional blanks. The value is infinite
    /// when the exponent is beyond the range of a double; the caller decides whether that is a reading (an SCPI
    /// overload) or garbage.
    /// </summary>
    public static bool TryParseDecimal(ReadOnlySpan<char> text, out double value)
    {
        value = 0;
        var span = TrimBlanks(text);
        var i = 0;
        if (i < span.Length && span[i] is '+' or '-')
        {
            i++;
        }

        var digits = CountDigits(span, ref i);
        if (i < span.Length && span[i] == '.')
        {
            i++;
            digits += CountDigits(span, ref i);
        }

        if (digits == 0)
        {
            return false;
        }

        if (i < span.Length && span[i] is 'e' or 'E')
        {
            i++;
            if (i < span.Length && span[i] is '+' or '-')
            {
                i++;
            }

            if (CountDigits(span, ref i) == 0)
            {
                return false;
            }
        }

        return i == span.Length && double.TryParse(span, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
    }

    /// <summary>Reads a whole number: an optional sign and ASCII digits, nothing else (no blanks), within the range of a <see cref="long"/>.</summary>
    public static bool TryParseWhole(ReadOnlySpan<char> text, out long value)
    {
        value = 0;
        var i = text.Length > 0 && text[0] is '+' or '-' ? 1 : 0;
        return CountDigits(text, ref i) > 0 && i == text.Length
            && long.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out value);
    }

    /// <summary><paramref name="text"/> without the spaces and TABs around it.</summary>
    public static ReadOnlySpan<char> TrimBlanks(ReadOnlySpan<char> text) => text.Trim(" \t");

    private static int CountDigits(ReadOnlySpan<char> text, ref int i)
    {
        var start = i;
        while (i < text.Length && char.IsAsciiDigit(text[i]))
        {
            i++;
        }

        return i - start;
    }
}
