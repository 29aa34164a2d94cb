using System.Text;
using System.Text.Json;

namespace LineTest.Core.Definitions;

/// <summary>
/// Maps JSON paths (<c>$.steps[2].setpoint</c>) to 1-based line numbers in the original text, so problems found
/// after deserialisation can still name the line. Built once per file by walking its tokens.
/// </summary>
public sealed class JsonLocator
{
    private readonly Dictionary<string, int> _lines = new(StringComparer.Ordinal);

    private JsonLocator()
    {
    }

    /// <summary>
    /// Builds a locator for UTF-8 JSON text (a leading byte-order mark is allowed). Malformed text yields a locator
    /// that knows the part before the error.
    /// </summary>
    public static JsonLocator Build(ReadOnlySpan<byte> utf8)
    {
        // The reader rejects a byte-order mark, which editors on Windows like to write; it precedes line 1, so
        // dropping it changes no line number.
        if (utf8.StartsWith((ReadOnlySpan<byte>)[0xEF, 0xBB, 0xBF]))
        {
            utf8 = utf8[3..];
        }

        var locator = new JsonLocator();
        var newlines = new List<int>();
        for (var i = 0; i < utf8.Length; i++)
        {
            if (utf8[i] == (byte)'\n')
            {
                newlines.Add(i);
            }
        }

        var reader = new Utf8JsonReader(utf8, new JsonReaderOptions
        {
            CommentHandling = JsonCommentHandling.Skip,
            AllowTrailingCommas = true,
        });

        // Each frame: the path of the container, whether it is an array, and the next index within it.
        var stack = new Stack<(string Path, bool IsArray, int NextIndex)>();
        string? pendingProperty = null;
        try
        {
            while (reader.Read())
            {
                var line = LineOf(newlines, checked((int)reader.TokenStartIndex));
                switch (reader.TokenType)
                {
                    case JsonTokenType.PropertyName:
                        pendingProperty = Combine(stack.Peek().Path, reader.GetString() ?? string.Empty);
                        locator._lines.TryAdd(pendingProperty, line);
                        break;
                    case JsonTokenType.StartObject:
                    case JsonTokenType.StartArray:
                        var path = ValuePath(stack, ref pendingProperty, line, locator);
                        stack.Push((path, reader.TokenType == JsonTokenType.StartArray, 0));
                        break;
                    case JsonTokenType.EndObject:
                    case JsonTokenType.EndArray:
                        stack.Pop();
                        break;
                    default:
                        ValuePath(stack, ref pendingProperty, line, locator);
                        break;
                }
            }
        }
        catch (JsonException)
        {
            // Malformed input: the deserialiser reports the syntax error itself; keep what was located so far.
        }

        return locator;
    }

    /// <summary>
    /// The line of <paramref name="jsonPath"/>, or of its nearest located ancestor (a missing property is
    /// reported at the object that lacks it).
    /// </summary>
    public int? LineOf(string jsonPath)
    {
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

    private static string ValuePath(
        Stack<(string Path, bool IsArray, int NextIndex)> stack, ref string? pendingProperty, int line, JsonLocator locator)
    {
        string path;
        if (stack.Count == 0)
        {
            path = "$";
        }
        else if (stack.Peek().IsArray)
        {
            var frame = stack.Pop();
            path = $"{frame.Path}[{frame.NextIndex}]";
            stack.Push((frame.Path, true, frame.NextIndex + 1));
        }
        else
        {
            path = pendingProperty ?? stack.Peek().Path;
        }

        pendingProperty = null;
        locator._lines.TryAdd(path, line);
        return path;
    }

    private static string Combine(string parent, string property)
    {
        foreach (var c in property)
        {
            if (!char.IsLetterOrDigit(c) && c != '_')
            {
                var builder = new StringBuilder(parent).Append("['").Append(property.Replace("'", "\\'", StringComparison.Ordinal)).Append("']");
                return builder.ToString();
            }
        }

        return $"{parent}.{property}";
    }

    private static int LineOf(List<int> newlines, int offset)
    {
        var index = newlines.BinarySearch(offset);
        return (index < 0 ? ~index : index) + 1;
    }
}
