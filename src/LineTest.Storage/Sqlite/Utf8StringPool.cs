using System.Text;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// Turns UTF-8 column text into strings, returning one shared instance per distinct text: reading names and units
/// repeat millions of times in a scan but take only a few dozen values. Bounded, so a column of unique texts costs
/// one dictionary of <see cref="MaxEntries"/> and then plain decoding.
/// </summary>
internal sealed class Utf8StringPool
{
    /// <summary>Most distinct texts kept.</summary>
    public const int MaxEntries = 4096;

    // Texts longer than this are decoded without pooling (names and units are far shorter).
    private const int MaxPooledBytes = 256;

    private readonly Dictionary<string, string> _pool = new(StringComparer.Ordinal);
    private readonly Dictionary<string, string>.AlternateLookup<ReadOnlySpan<char>> _lookup;

    public Utf8StringPool() => _lookup = _pool.GetAlternateLookup<ReadOnlySpan<char>>();

    /// <summary>The string for <paramref name="utf8"/>, shared with earlier calls for the same text.</summary>
    public string Get(ReadOnlySpan<byte> utf8)
    {
        if (utf8.Length > MaxPooledBytes)
        {
            return Encoding.UTF8.GetString(utf8);
        }

        // UTF-8 never needs more chars than bytes.
        Span<char> chars = stackalloc char[MaxPooledBytes];
        var length = Encoding.UTF8.GetChars(utf8, chars);
        var text = chars[..length];
        if (_lookup.TryGetValue(text, out var pooled))
        {
            return pooled;
        }

        var created = new string(text);
        if (_pool.Count < MaxEntries)
        {
            _pool[created] = created;
        }

        return created;
    }
}
