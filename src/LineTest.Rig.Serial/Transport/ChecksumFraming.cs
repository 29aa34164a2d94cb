using System.Globalization;

namespace LineTest.Rig.Serial.Transport;

/// <summary>
/// A message followed by <c>*</c> and two upper-case hex digits: the sum of the message's bytes modulo 256.
/// Used on the unit link, where a corrupted trim value must never be taken for a good one.
/// </summary>
public sealed class ChecksumFraming : ILineFraming
{
    private static readonly System.Buffers.SearchValues<char> Printable = System.Buffers.SearchValues.Create(
        "\t !\"#$%&'()*+,-./0123456789:;<=>?@ABCDEFGHIJKLMNOPQRSTUVWXYZ[\\]^_`abcdefghijklmnopqrstuvwxyz{|}~");

    /// <summary>The one instance.</summary>
    public static ChecksumFraming Instance { get; } = new();

    /// <summary>The checksum of <paramref name="body"/>: sum of its (ASCII) bytes modulo 256.</summary>
    public static byte Checksum(string body)
    {
        ArgumentNullException.ThrowIfNull(body);
        var sum = 0;
        foreach (var c in body)
        {
            sum = (sum + (c & 0xFF)) & 0xFF;
        }

        return (byte)sum;
    }

    /// <inheritdoc/>
    public string Encode(string body)
    {
        ArgumentNullException.ThrowIfNull(body);
        if (body.Contains('*', StringComparison.Ordinal))
        {
            throw new ArgumentException($"A unit-link message cannot contain '*': '{body}'.", nameof(body));
        }

        return string.Create(CultureInfo.InvariantCulture, $"{body}*{Checksum(body):X2}");
    }

    /// <inheritdoc/>
    /// <remarks>
    /// A frame is printable ASCII, one <c>*</c> and exactly two upper-case hex digits after it; a message that
    /// contains <c>*</c> cannot have been encoded, so it is garbage even when its checksum happens to match.
    /// </remarks>
    public ReplyParse<string> Decode(string line)
    {
        ArgumentNullException.ThrowIfNull(line);
        var star = line.IndexOf('*', StringComparison.Ordinal);
        if (star < 0 || star != line.Length - 3)
        {
            return ReplyParse<string>.NotUnderstood($"'{line}' does not end in one '*' and a two-digit checksum");
        }

        var body = line[..star];
        if (!IsUpperHex(line[star + 1]) || !IsUpperHex(line[star + 2]))
        {
            return ReplyParse<string>.NotUnderstood($"checksum '{line[(star + 1)..]}' of '{line}' is not hexadecimal (two upper-case digits 0-9, A-F)");
        }

        if (body.AsSpan().ContainsAnyExcept(Printable))
        {
            return ReplyParse<string>.NotUnderstood($"'{line}' has characters other than printable ASCII");
        }

        var received = byte.Parse(line.AsSpan(star + 1), NumberStyles.AllowHexSpecifier, CultureInfo.InvariantCulture);

        var expected = Checksum(body);
        return received == expected
            ? ReplyParse<string>.Ok(body)
            : ReplyParse<string>.NotUnderstood(string.Create(CultureInfo.InvariantCulture, $"checksum {received:X2} of '{line}' does not match its message (expected {expected:X2})"));
    }

    private static bool IsUpperHex(char c) => char.IsAsciiDigit(c) || c is >= 'A' and <= 'F';
}
