namespace LineTest.Reports.Loading;

/// <summary>
/// Interns repeated strings (stations, lots, reasons) as small integer ids, so a table of a million runs
/// holds each distinct text once.
/// </summary>
internal sealed class StringPool
{
    private readonly Dictionary<string, int> _ids = new(StringComparer.Ordinal);
    private readonly List<string> _texts = [];

    /// <summary>The id of <paramref name="text"/>, or -1 for null.</summary>
    public int Intern(string? text)
    {
        if (text is null)
        {
            return -1;
        }

        if (!_ids.TryGetValue(text, out var id))
        {
            id = _texts.Count;
            _ids.Add(text, id);
            _texts.Add(text);
        }

        return id;
    }

    /// <summary>The text of <paramref name="id"/>, or null for -1.</summary>
    public string? Text(int id) => id < 0 ? null : _texts[id];
}
