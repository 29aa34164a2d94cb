using System.Text;

namespace LineTest.Core.Definitions;

/// <summary>
/// Maps JSON paths (<c>$.steps[2].setpoint</c>) to 1-based line numbers in the original text, so problems found
/// after deserialisation can still name the line. Filled by the one scan of a file (<see cref="JsonScan"/>).
/// </summary>
public sealed class JsonLocator
{
    private readonly Dictionary<string, int> _lines = new(StringComparer.Ordinal);

    internal JsonLocator()
    {
    }

    /// <summary>
    /// Builds a locator for UTF-8 JSON text (a leading byte-order mark is allowed). Malformed text yields a locator
    /// that knows the part before the error.
    /// </summary>
    public static JsonLocator Build(ReadOnlySpan<byte> utf8) => JsonScan.Read(JsonDefinitionReader.SkipBom(utf8)).Locator;

    /// <summary>
    /// The line of <paramref name="jsonPath"/>, or of its nearest located ancestor (a missing property is
    /// reported at the object that lacks it).
    /// </summary>
    public int? LineOf(string jsonPath)
    {
        ArgumentNullException.ThrowIfNull(jsonPath);
        var path = jsonPath;
        while (true)
        {
            if (_lines.TryGetValue(path, out var line))
            {
                return line;
            }

            var cut = Math.Max(path.LastIndexOf('.'), path.LastIndexOf('['));
            if (cut <= 0)
            {
                return _lines.TryGetValue("$", out var root) ? root : null;
            }

            path = path[..cut];
        }
    }

    /// <summary>Records the line of a path; the first occurrence wins.</summary>
    internal void Add(string path, int line) => _lines.TryAdd(path, line);

    /// <summary>The path of a property: <c>parent.name</c>, or <c>parent['odd key']</c> for a key that is not a plain word.</summary>
    internal static string Combine(string parent, string property)
    {
        foreach (var c in property)
        {
            if (!char.IsLetterOrDigit(c) && c != '_')
            {
                var builder = new StringBuilder(parent).Append("['").Append(property.Replace("'", "\\'", StringComparison.Ordinal)).Append("']");
                return builder.ToString();
            }
        }

        return property.Length == 0 ? $"{parent}['']" : $"{parent}.{property}";
    }
}
