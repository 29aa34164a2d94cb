using System.Globalization;
using CsCheck;

namespace LineTest.Rig.Serial.Tests;

/// <summary>What one piece of a received byte stream is, and so what a line reader must make of it.</summary>
internal enum SegmentKind
{
    /// <summary>Printable ASCII and a line end: the text is a line.</summary>
    Good,

    /// <summary>A line with at least one non-printable byte: refused, naming the first such byte.</summary>
    Noise,

    /// <summary>More bytes than a line may hold before its line end: refused as too long, the rest dropped.</summary>
    TooLong,

    /// <summary>Only a line end (a scanner's empty line): nothing.</summary>
    Empty,
}

/// <summary>One piece of a byte stream built for a line reader, with what it must produce.</summary>
internal sealed record Segment(SegmentKind Kind, byte[] Bytes, string? Text, byte? FirstBad)
{
    public string Expected => Kind switch
    {
        SegmentKind.Good => "line " + WireFuzz.Show(Text!),
        SegmentKind.Noise => string.Create(CultureInfo.InvariantCulture, $"non-printable byte 0x{FirstBad:X2}"),
        SegmentKind.TooLong => "longer than",
        _ => "nothing",
    };
}

/// <summary>
/// Byte streams built piece by piece from what the transport rules of docs/instrument-protocols.md say each piece must
/// become: the expected lines are known by construction, not by running the code under test.
/// </summary>
internal static class WireSegments
{
    // Bytes that are not a line end: printable ASCII, and the usual noise (NUL, DEL, high bytes, other controls).
    private static readonly Gen<byte> Printable = Gen.Byte[0x20, 0x7E];

    private static readonly Gen<byte> NonPrintable = Gen.OneOf(Gen.Byte[0x00, 0x08], Gen.Byte[0x0B, 0x0C], Gen.Byte[0x0E, 0x1F], Gen.Byte[0x7F, 0xFF]);

    private static Gen<byte> NotLineEnd(bool carriageReturnEndsLine) =>
        Gen.Frequency((3, Printable), (1, NonPrintable), (1, Gen.Const((byte)'\t')), (carriageReturnEndsLine ? 0 : 1, Gen.Const((byte)'\r')));

    /// <summary>A line end as instruments (LF, CR LF) or scanners (CR, LF, CR LF) send it.</summary>
    public static Gen<byte[]> LineEnd(bool carriageReturnEndsLine) => carriageReturnEndsLine
        ? Gen.OneOf<byte[]>([(byte)'\r'], [(byte)'\n'], [(byte)'\r', (byte)'\n'])
        : Gen.OneOf<byte[]>([(byte)'\n'], [(byte)'\r', (byte)'\n']);

    /// <summary>One piece of a stream for a reader with <paramref name="maxLength"/>.</summary>
    public static Gen<Segment> Segment(int maxLength, bool carriageReturnEndsLine, Gen<string>? goodText = null)
    {
        goodText ??= Gen.String[Gen.OneOf(Gen.Char[' ', '~'], Gen.Const('\t')), carriageReturnEndsLine ? 1 : 0, maxLength];
        var end = LineEnd(carriageReturnEndsLine);
        var good = Gen.Select(goodText, end, (text, e) => new Segment(SegmentKind.Good, [.. text.Select(c => (byte)c), .. e], text, null));
        var noise = Gen.Select(NotLineEnd(carriageReturnEndsLine).Array[0, maxLength - 1], NonPrintable, Gen.Int[0, maxLength], end, (bytes, bad, at, e) =>
        {
            var line = bytes.ToList();
            line.Insert(at % (line.Count + 1), bad);

            // An instrument line's CR just before its LF is dropped, so it is not the first bad byte.
            var judged = !carriageReturnEndsLine && e.Length == 1 && line[^1] == (byte)'\r' ? line[..^1] : line;
            var first = judged.First(b => !(b is >= 0x20 and <= 0x7E or (byte)'\t'));
            return new Segment(SegmentKind.Noise, [.. line, .. e], null, first);
        });
        var tooLong = Gen.Select(NotLineEnd(carriageReturnEndsLine).Array[maxLength + 2, maxLength + 40], end,
            (bytes, e) => new Segment(SegmentKind.TooLong, [.. bytes, .. e], null, null));
        var empty = end.Select(e => new Segment(SegmentKind.Empty, e, null, null));
        return carriageReturnEndsLine
            ? Gen.Frequency((4, good), (2, noise), (1, tooLong), (1, empty))
            : Gen.Frequency((4, good), (2, noise), (1, tooLong));
    }

    /// <summary>The bytes of <paramref name="segments"/> one after another.</summary>
    public static byte[] Concat(IEnumerable<Segment> segments) => [.. segments.SelectMany(s => s.Bytes)];

    /// <summary>Cuts <paramref name="bytes"/> into chunks at the given positions, as a port hands them over.</summary>
    public static List<byte[]> Chunks(byte[] bytes, int[] cuts)
    {
        var points = cuts.Select(c => c % (bytes.Length + 1)).Append(0).Append(bytes.Length).Distinct().Order().ToList();
        return [.. points.Zip(points.Skip(1), (a, b) => bytes[a..b])];
    }
}
