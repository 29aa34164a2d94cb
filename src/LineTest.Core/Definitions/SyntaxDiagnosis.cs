using System.Text.Json;

namespace LineTest.Core.Definitions;

/// <summary>
/// Names a syntax error of a definition file for a person, from where the reader stopped (its line and byte in the
/// line), the bytes there, and the state of the scan (depth, the last value's line): the reader's message is English
/// prose for developers and is never shown or taken apart.
/// </summary>
internal static class SyntaxDiagnosis
{
    private const string Prefix = "not valid JSON here: ";

    /// <summary>The problem (path, line, reason) for the reader's error <paramref name="ex"/>.</summary>
    /// <param name="text">The text that was read.</param>
    /// <param name="lineStarts">Offsets of the line starts.</param>
    /// <param name="ex">The reader's exception (only its position is used).</param>
    /// <param name="depth">Open objects and arrays at the error.</param>
    /// <param name="path">Path of the value being read, or of the open container.</param>
    /// <param name="rootClosed">True when the top-level value was already complete.</param>
    /// <param name="lastValueLine">Line where the last complete value ended.</param>
    public static (string Path, int Line, string Reason) Explain(
        ReadOnlySpan<byte> text, List<int> lineStarts, JsonException ex, int depth, string path, bool rootClosed, int lastValueLine)
    {
        var line0 = (int)Math.Clamp(ex.LineNumber ?? 0, 0, lineStarts.Count - 1);
        var offset = (int)Math.Min(lineStarts[line0] + (ex.BytePositionInLine ?? 0), text.Length);
        var line = JsonScan.LineOf(lineStarts, Math.Min(offset, Math.Max(0, text.Length - 1)));
        // The reader stopped at a raw control character: whitespace between tokens never stops it, so this is inside a
        // string; most often the closing quote is missing and the string ran into the line end.
        if (offset < text.Length && text[offset] < 0x20)
        {
            return text[offset] is (byte)'\n' or (byte)'\r'
                ? (path, line, Prefix + "a string is not closed on this line (a closing quote is missing)")
                : (path, line, Prefix + $"a string holds the control character {Show(text[offset])}; write it as an escape such as \\t");
        }

        var next = SkipBlanks(text, offset);
        if (SkipBlanks(text, 0) >= text.Length)
        {
            return ("$", 1, "the file is empty: a definition file holds one JSON object");
        }

        if (next >= text.Length)
        {
            return depth > 0 || !rootClosed
                ? ("$", lineStarts.Count, Prefix + "the file ends before every object and array is closed (is it cut short?)")
                : ("$", lineStarts.Count, Prefix + "the file ends unexpectedly");
        }

        var b = text[next];
        var at = Show(b);
        if (rootClosed && depth == 0)
        {
            return ("$", line, Prefix + $"there is more after the end of the object ({at}): a file holds one JSON object");
        }

        if (depth >= 64)
        {
            return (path, line, Prefix + "objects and arrays are nested more than 64 deep");
        }

        // A value or key starts where a comma (or the closing bracket) had to come: the comma belongs after the value before.
        if (PreviousIsValueEnd(text, offset) && b is (byte)'"' or (byte)'{' or (byte)'[' or (byte)'-' or (>= (byte)'0' and <= (byte)'9') or (byte)'t' or (byte)'f' or (byte)'n')
        {
            return (path, lastValueLine, Prefix + "a comma is missing after this value (or a bracket is not closed)");
        }

        return b switch
        {
            (byte)'\'' => (path, line, Prefix + "strings and keys need double quotes, not single quotes"),
            (byte)'}' or (byte)']' => (path, line, Prefix + $"{at} does not close what is open here (a bracket or brace is missing or extra, or a value is missing)"),
            (byte)':' => (path, line, Prefix + "a ':' without a key before it"),
            (byte)',' => (path, line, Prefix + "a ',' where a value belongs (a value is missing, or there are two commas)"),
            _ when IsWordStart(b) => (path, line, Prefix + $"a value cannot start with {at} (strings need double quotes; NaN and Infinity are not allowed)"),
            _ => (path, line, Prefix + $"unexpected {at}"),
        };
    }

    private static int SkipBlanks(ReadOnlySpan<byte> text, int offset)
    {
        while (offset < text.Length && text[offset] is (byte)' ' or (byte)'\t' or (byte)'\r' or (byte)'\n')
        {
            offset++;
        }

        return offset;
    }

    /// <summary>True when the last non-blank byte before <paramref name="offset"/> ends a value (a quote, digit, letter or bracket).</summary>
    private static bool PreviousIsValueEnd(ReadOnlySpan<byte> text, int offset)
    {
        for (var i = Math.Min(offset, text.Length) - 1; i >= 0; i--)
        {
            var b = text[i];
            if (b is (byte)' ' or (byte)'\t' or (byte)'\r' or (byte)'\n')
            {
                continue;
            }

            return b is (byte)'"' or (byte)'}' or (byte)']' or (>= (byte)'0' and <= (byte)'9') or (byte)'e' or (byte)'l';
        }

        return false;
    }

    private static bool IsWordStart(byte b) => b is (>= (byte)'a' and <= (byte)'z') or (>= (byte)'A' and <= (byte)'Z') or (byte)'_' or (byte)'+' or (byte)'.';

    private static string Show(byte b) => b is >= 0x20 and < 0x7F ? $"'{(char)b}'" : $"byte 0x{b:X2}";
}
