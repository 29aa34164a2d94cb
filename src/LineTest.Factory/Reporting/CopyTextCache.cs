using System.Text;

namespace LineTest.Factory.Reporting;

/// <summary>
/// The strings of one read's texts: a text seen before comes back as the same string without decoding, so a million
/// rows that name a few stations, lots and readings make a few strings. Not thread-safe: one per reader.
/// </summary>
internal sealed class CopyTextCache
{
    /// <summary>Most distinct texts kept; they are compared byte by byte.</summary>
    private const int Scanned = 64;

    private readonly List<(byte[] Utf8, string Text)> _entries = [];
    private int _last;

    /// <summary>The string for <paramref name="utf8"/>.</summary>
    public string Get(ReadOnlySpan<byte> utf8)
    {
        if (_last < _entries.Count && utf8.SequenceEqual(_entries[_last].Utf8))
        {
            return _entries[_last].Text;
        }

        for (var i = 0; i < _entries.Count; i++)
        {
            if (utf8.SequenceEqual(_entries[i].Utf8))
            {
                _last = i;
                return _entries[i].Text;
            }
        }

        var text = Encoding.UTF8.GetString(utf8);
        if (_entries.Count < Scanned)
        {
            _last = _entries.Count;
            _entries.Add((utf8.ToArray(), text));
        }

        // Beyond that (e.g. serials, nearly all different), each is decoded as it comes.
        return text;
    }
}
