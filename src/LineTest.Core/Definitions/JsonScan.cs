using System.Text.Json;
using System.Text.Json.Nodes;

namespace LineTest.Core.Definitions;

/// <summary>
/// The one pass over a definition file's text: a <see cref="Utf8JsonReader"/> walks the tokens once and, from its
/// own positions, builds the document (<see cref="Root"/>), the map from JSON paths to lines (<see cref="Locator"/>)
/// and the strict-JSON problems: comments, trailing commas and keys given twice (with both lines) are errors, and a
/// syntax error is named from the bytes at the reader's position and what came before it, never from the wording of
/// an exception message.
/// </summary>
internal sealed class JsonScan
{
    private JsonScan(JsonNode? root, bool complete, JsonLocator locator, List<(string Path, int Line, string Reason)> problems)
    {
        Root = root;
        Complete = complete;
        Locator = locator;
        Problems = problems;
    }

    /// <summary>The document, when the text was read to its end (null also for a document that is <c>null</c>).</summary>
    public JsonNode? Root { get; }

    /// <summary>True when the reader reached the end of the text without a syntax error.</summary>
    public bool Complete { get; }

    /// <summary>Lines of every path met (all of them before a syntax error).</summary>
    public JsonLocator Locator { get; }

    /// <summary>Strict-JSON and syntax problems, in file order.</summary>
    public List<(string Path, int Line, string Reason)> Problems { get; }

    /// <summary>Scans UTF-8 text without a byte-order mark.</summary>
    public static JsonScan Read(ReadOnlySpan<byte> text)
    {
        var lines = LineStarts(text);
        var locator = new JsonLocator();
        var problems = new List<(string Path, int Line, string Reason)>();
        var stack = new Stack<Frame>();
        JsonNode? root = null;
        var rootSeen = false;
        var lastValueLine = 1;
        var reader = new Utf8JsonReader(text, new JsonReaderOptions { CommentHandling = JsonCommentHandling.Allow, AllowTrailingCommas = true });
        try
        {
            while (reader.Read())
            {
                var start = checked((int)reader.TokenStartIndex);
                var line = LineOf(lines, start);
                switch (reader.TokenType)
                {
                    case JsonTokenType.Comment:
                        problems.Add((stack.TryPeek(out var open) ? open.Path : "$", line,
                            "comments are not allowed: a definition file is strict JSON (put notes in a \"description\")"));
                        break;
                    case JsonTokenType.PropertyName:
                        var frame = stack.Peek();
                        var name = reader.GetString() ?? string.Empty;
                        var path = JsonLocator.Combine(frame.Path, name);
                        if (frame.Keys.TryGetValue(name, out var firstLine))
                        {
                            problems.Add((path, line, $"'{name}' is given twice: first at line {firstLine}, again at line {line}; keep one"));
                            frame.Pending = (name, path, Skip: true);
                        }
                        else
                        {
                            frame.Keys[name] = line;
                            frame.Pending = (name, path, Skip: false);
                            locator.Add(path, line);
                        }

                        break;
                    case JsonTokenType.StartObject:
                    case JsonTokenType.StartArray:
                        JsonNode container = reader.TokenType == JsonTokenType.StartObject ? new JsonObject() : new JsonArray();
                        var containerPath = Attach(stack, container, line, locator, ref root, ref rootSeen);
                        stack.Push(new Frame(containerPath, container));
                        break;
                    case JsonTokenType.EndObject:
                    case JsonTokenType.EndArray:
                        if (TrailingComma(text, start) is { } comma)
                        {
                            problems.Add((stack.Peek().Path, LineOf(lines, comma),
                                $"a comma before the closing '{(char)text[start]}' is not allowed: a definition file is strict JSON (remove the last comma)"));
                        }

                        stack.Pop();
                        lastValueLine = line;
                        break;
                    default:
                        var value = Value(ref reader);
                        Attach(stack, value, line, locator, ref root, ref rootSeen);
                        lastValueLine = LineOf(lines, Math.Max(start, checked((int)reader.BytesConsumed) - 1));
                        break;
                }
            }
        }
        catch (JsonException ex)
        {
            problems.Add(SyntaxDiagnosis.Explain(text, lines, ex, stack.Count, stack.TryPeek(out var top) ? top.PendingPath ?? top.Path : "$",
                rootSeen && stack.Count == 0, lastValueLine));
            return new JsonScan(null, false, locator, problems);
        }

        if (!rootSeen)
        {
            problems.Add(("$", 1, "the file is empty: a definition file holds one JSON object"));
            return new JsonScan(null, false, locator, problems);
        }

        return new JsonScan(root, true, locator, problems);
    }

    /// <summary>The node of a primitive token; a number keeps its literal (so 1.0 stays a fraction for a whole-number key).</summary>
    private static JsonValue? Value(ref Utf8JsonReader reader)
    {
        switch (reader.TokenType)
        {
            case JsonTokenType.String:
                return JsonValue.Create(reader.GetString()!);
            case JsonTokenType.True:
                return JsonValue.Create(true);
            case JsonTokenType.False:
                return JsonValue.Create(false);
            case JsonTokenType.Number:
                // A number literal has no escapes: its bytes are the literal, read alone as one JSON value.
                var literal = new Utf8JsonReader(reader.ValueSpan);
                literal.Read();
                return JsonValue.Create(JsonElement.ParseValue(ref literal));
            default:
                return null;
        }
    }

    /// <summary>Offsets at which each line begins (line 1 at 0).</summary>
    internal static List<int> LineStarts(ReadOnlySpan<byte> text)
    {
        var starts = new List<int> { 0 };
        for (var i = 0; i < text.Length; i++)
        {
            if (text[i] == (byte)'\n')
            {
                starts.Add(i + 1);
            }
        }

        return starts;
    }

    /// <summary>1-based line of a byte offset.</summary>
    internal static int LineOf(List<int> lineStarts, int offset)
    {
        var index = lineStarts.BinarySearch(offset);
        return index >= 0 ? index + 1 : ~index;
    }

    /// <summary>Places a value in its container (or as the root) and returns its path.</summary>
    private static string Attach(Stack<Frame> stack, JsonNode? node, int line, JsonLocator locator, ref JsonNode? root, ref bool rootSeen)
    {
        if (stack.Count == 0)
        {
            root = node;
            rootSeen = true;
            locator.Add("$", line);
            return "$";
        }

        var frame = stack.Peek();
        if (frame.Node is JsonArray array)
        {
            var itemPath = $"{frame.Path}[{array.Count}]";
            array.Add(node);
            locator.Add(itemPath, line);
            return itemPath;
        }

        var (name, path, skip) = frame.Pending ?? (string.Empty, frame.Path, true);
        frame.Pending = null;
        if (!skip)
        {
            ((JsonObject)frame.Node).Add(name, node);
        }

        return path;
    }

    /// <summary>The offset of a comma that directly precedes the closing bracket at <paramref name="end"/>, or null.</summary>
    private static int? TrailingComma(ReadOnlySpan<byte> text, int end)
    {
        for (var i = end - 1; i >= 0; i--)
        {
            switch (text[i])
            {
                case (byte)' ' or (byte)'\t' or (byte)'\r' or (byte)'\n':
                    continue;
                case (byte)',':
                    return i;
                default:
                    return null;
            }
        }

        return null;
    }

    private sealed class Frame(string path, JsonNode node)
    {
        public string Path { get; } = path;

        public JsonNode Node { get; } = node;

        public Dictionary<string, int> Keys { get; } = new(StringComparer.Ordinal);

        public (string Name, string Path, bool Skip)? Pending { get; set; }

        public string? PendingPath => Pending?.Path;
    }
}
