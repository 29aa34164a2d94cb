using System.Security.Cryptography;
using System.Text.Json;
using System.Text.RegularExpressions;

namespace LineTest.Core.Definitions;

/// <summary>
/// Parses a definition file (sequence or fixture) into typed records. Syntax and type errors become
/// <see cref="DefinitionProblem"/>s with file, line, JSON path and a plain reason; the caller then runs its
/// semantic checks and locates their problems with the returned <see cref="JsonLocator"/>.
/// </summary>
public static partial class JsonDefinitionReader
{
    /// <summary>Parses <paramref name="utf8"/> as <typeparamref name="T"/>.</summary>
    /// <param name="file">File name used in problems.</param>
    /// <param name="utf8">The file's bytes.</param>
    public static ParsedDefinition<T> Parse<T>(string file, byte[] utf8)
        where T : class
    {
        ArgumentNullException.ThrowIfNull(utf8);
        var sha = Convert.ToHexStringLower(SHA256.HashData(utf8));
        var text = SkipBom(utf8);
        if (FirstInvalidUtf8(text) is { } bad)
        {
            // The serialiser throws InvalidOperationException (not JsonException) on bytes that are not UTF-8, e.g. a
            // file damaged on disk or saved in another encoding: report where, as for any other mistake in the file.
            var badLine = 1 + text[..bad].Count((byte)'\n');
            return new ParsedDefinition<T>(
                null,
                [new DefinitionProblem(file, badLine, "$", $"byte {bad} is not valid UTF-8 text; save the file as UTF-8 (it may be damaged or in another encoding)")],
                sha,
                JsonLocator.Build([]));
        }

        var locator = JsonLocator.Build(text);
        try
        {
            var value = JsonSerializer.Deserialize<T>(text, LineTestJson.Definitions);
            if (value is null)
            {
                return new ParsedDefinition<T>(null, [new DefinitionProblem(file, 1, "$", "the file holds null instead of an object")], sha, locator);
            }

            // A null entry in a list (e.g. "slots": [null]) is accepted by the serialiser, which does not apply
            // nullable annotations to collection elements; the checkers expect objects, so refuse it here.
            var nulls = NullListEntries(text);
            if (nulls.Count > 0)
            {
                return new ParsedDefinition<T>(
                    null, [.. nulls.Select(path => new DefinitionProblem(file, locator.LineOf(path), path, "the list entry is null; give a value"))], sha, locator);
            }

            return new ParsedDefinition<T>(value, [], sha, locator);
        }
        catch (JsonException ex)
        {
            var path = string.IsNullOrEmpty(ex.Path) ? "$" : ex.Path;
            if (EnumProblem(ex, utf8, path) is { } enumReason)
            {
                int? enumLine = ex.LineNumber is { } el ? checked((int)el + 1) : locator.LineOf(path);
                return new ParsedDefinition<T>(null, [new DefinitionProblem(file, enumLine, path, enumReason)], sha, locator);
            }

            var reason = PlainReason(ex, KindsAt(typeof(T), path));

            // A missing property has no line of its own: name the line where the object that lacks it begins,
            // not the line of its closing brace where the serialiser noticed.
            int? line = reason.StartsWith(MissingPrefix, StringComparison.Ordinal) || ex.LineNumber is null
                ? locator.LineOf(path)
                : checked((int)ex.LineNumber.Value + 1);

            // The reader notices a missing comma at the next token, usually on the next line; the comma belongs
            // after the value before it, so name that value's line.
            if (reason == MissingCommaReason && ex.LineNumber is { } errorLine && ex.BytePositionInLine is { } errorByte)
            {
                line = LineBefore(text, errorLine, errorByte) ?? line;
            }

            return new ParsedDefinition<T>(null, [new DefinitionProblem(file, line, path, reason)], sha, locator);
        }
        catch (NotSupportedException ex) when (MissingDiscriminator().Match(ex.Message) is { Success: true } missing)
        {
            // An object of a polymorphic type (a step) without its "kind" key: the serialiser reports this as
            // unsupported rather than as bad JSON, but for the engineer it is an ordinary mistake in the file.
            var path = missing.Groups["path"].Value;
            var kinds = KindsAt(typeof(T), path);
            var reason = kinds is null
                ? "the object needs its 'kind' key"
                : $"the object needs a '{kinds.Value.Key}' key naming its kind (known: {string.Join(", ", kinds.Value.Kinds)})";
            return new ParsedDefinition<T>(null, [new DefinitionProblem(file, locator.LineOf(path), path, reason)], sha, locator);
        }
    }

    /// <summary>JSON paths of null entries in arrays, in document order.</summary>
    private static List<string> NullListEntries(ReadOnlySpan<byte> text)
    {
        var paths = new List<string>();
        using var document = JsonDocument.Parse(text.ToArray(), new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        Walk(document.RootElement, "$");
        return paths;

        void Walk(JsonElement element, string path)
        {
            switch (element.ValueKind)
            {
                case JsonValueKind.Object:
                    foreach (var property in element.EnumerateObject())
                    {
                        Walk(property.Value, $"{path}.{property.Name}");
                    }

                    break;
                case JsonValueKind.Array:
                    var i = 0;
                    foreach (var item in element.EnumerateArray())
                    {
                        var itemPath = $"{path}[{i++}]";
                        if (item.ValueKind == JsonValueKind.Null)
                        {
                            paths.Add(itemPath);
                        }
                        else
                        {
                            Walk(item, itemPath);
                        }
                    }

                    break;
            }
        }
    }

    /// <summary>Index of the first byte that does not belong to valid UTF-8, or null when all of it is valid.</summary>
    private static int? FirstInvalidUtf8(ReadOnlySpan<byte> text)
    {
        if (System.Text.Unicode.Utf8.IsValid(text))
        {
            return null;
        }

        var index = 0;
        while (index < text.Length)
        {
            if (System.Text.Rune.DecodeFromUtf8(text[index..], out _, out var consumed) != System.Buffers.OperationStatus.Done)
            {
                return index;
            }

            index += consumed;
        }

        return index;
    }

    /// <summary>Reads and parses a file; a missing or unreadable file becomes a problem, not an exception.</summary>
    public static ParsedDefinition<T> ReadFile<T>(string path)
        where T : class
    {
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            var reason = ex is FileNotFoundException or DirectoryNotFoundException
                ? "file not found"
                : $"cannot read the file: {ex.Message}";
            return new ParsedDefinition<T>(null, [new DefinitionProblem(path, null, "$", reason)], null, JsonLocator.Build([]));
        }

        return Parse<T>(path, bytes);
    }

    /// <summary>Rewrites the serialiser's message into plain words without its own location suffix.</summary>
    internal static string PlainReason(JsonException ex) => PlainReason(ex, null);

    private static string PlainReason(JsonException ex, (string Key, IReadOnlyList<string> Kinds)? kinds)
    {
        var message = LocationSuffix().Replace(ex.Message, string.Empty).Trim();
        if (MissingRequired().Match(message) is { Success: true } missing)
        {
            var names = missing.Groups[1].Value.Trim();
            return names.Contains(',', StringComparison.Ordinal) ? $"{MissingPrefix}ies {names}" : $"{MissingPrefix}y {names}";
        }

        if (UnknownProperty().Match(message) is { Success: true } unknown)
        {
            return $"unknown property '{unknown.Groups[1].Value}' (check the spelling; keys are camelCase)";
        }

        if (UnknownDiscriminator().Match(message) is { Success: true } kind)
        {
            return kinds is { } k
                ? $"unknown kind '{kind.Groups[1].Value}' (known: {string.Join(", ", k.Kinds)})"
                : $"unknown kind '{kind.Groups[1].Value}'";
        }

        if (message.Contains("duplicate", StringComparison.Ordinal) && DuplicateMetadata().Match(message) is { Success: true } duplicate)
        {
            return $"'{duplicate.Groups[1].Value}' is given twice";
        }

        if (message.Contains("could not be converted to", StringComparison.Ordinal))
        {
            var target = ConvertTarget().Match(message);
            var expected = target.Success ? Describe(target.Groups[1].Value) : "a different type of value";
            return $"expected {expected}";
        }

        if (message.Contains("null", StringComparison.OrdinalIgnoreCase)
            && (message.Contains("non-nullable", StringComparison.OrdinalIgnoreCase) || message.Contains("allow setting null", StringComparison.Ordinal)))
        {
            return "a value is required here, not null";
        }

        if (SyntaxReason(message) is { } syntax)
        {
            return syntax;
        }

        if (ex.InnerException is { } inner && message.Length == 0)
        {
            return inner.Message;
        }

        return $"not valid JSON here: {message}";
    }

    /// <summary>The reader's syntax messages most often met in hand-edited files, in plain words.</summary>
    private static string? SyntaxReason(string message)
    {
        if (message.Contains("is invalid after a value", StringComparison.Ordinal))
        {
            return MissingCommaReason;
        }

        if (message.Contains("is invalid within a JSON string", StringComparison.Ordinal) && message.Contains("0x0A", StringComparison.Ordinal))
        {
            return "not valid JSON here: a string is not closed on this line (a closing quote is missing)";
        }

        if (message.Contains("end of data", StringComparison.Ordinal) || message.Contains("Expected depth to be zero", StringComparison.Ordinal))
        {
            return "not valid JSON here: the file ends before every object and array is closed (is it cut short?)";
        }

        if (InvalidStart().Match(message) is { Success: true } start)
        {
            return $"not valid JSON here: a value cannot start with '{start.Groups[1].Value}' (strings need double quotes; NaN and Infinity are not allowed)";
        }

        return null;
    }

    /// <summary>
    /// The 1-based line of the last non-blank byte before the position (0-based line, 0-based byte in that line),
    /// or null when there is none.
    /// </summary>
    private static int? LineBefore(ReadOnlySpan<byte> text, long line0, long byteInLine)
    {
        var offset = 0;
        for (var l = 0L; l < line0 && offset < text.Length; offset++)
        {
            if (text[offset] == (byte)'\n')
            {
                l++;
            }
        }

        var line = checked((int)line0 + 1);
        for (var i = Math.Min(checked(offset + (int)byteInLine), text.Length) - 1; i >= 0; i--)
        {
            switch (text[i])
            {
                case (byte)'\n':
                    line--;
                    break;
                case (byte)' ' or (byte)'\t' or (byte)'\r':
                    break;
                default:
                    return line;
            }
        }

        return null;
    }

    /// <summary>
    /// The discriminator key and known kinds of the polymorphic type found at <paramref name="jsonPath"/> when
    /// walking the serialiser's contract from <paramref name="root"/>, or null when the path leads elsewhere.
    /// </summary>
    private static (string Key, IReadOnlyList<string> Kinds)? KindsAt(Type root, string jsonPath)
    {
        var info = LineTestJson.Definitions.GetTypeInfo(root);
        foreach (Match segment in PathSegment().Matches(jsonPath))
        {
            if (segment.Groups["index"].Success)
            {
                if (info.ElementType is not { } element)
                {
                    return null;
                }

                info = LineTestJson.Definitions.GetTypeInfo(element);
                continue;
            }

            var name = segment.Groups["name"].Success ? segment.Groups["name"].Value : segment.Groups["quoted"].Value;
            var property = info.Properties.FirstOrDefault(p => p.Name == name);
            if (property is null)
            {
                return null;
            }

            info = LineTestJson.Definitions.GetTypeInfo(property.PropertyType);
        }

        if (info.PolymorphismOptions is not { } polymorphism)
        {
            return null;
        }

        var kinds = polymorphism.DerivedTypes.Select(d => d.TypeDiscriminator?.ToString()).OfType<string>().ToList();
        return (polymorphism.TypeDiscriminatorPropertyName, kinds);
    }

    /// <summary>
    /// A word that is not one of an enum's names (e.g. a decision rule) gets a reason that quotes the word and
    /// lists the accepted ones; the serialiser's own message names only the CLR type.
    /// </summary>
    private static string? EnumProblem(JsonException ex, byte[] utf8, string path)
    {
        var target = ConvertTarget().Match(ex.Message);
        if (!target.Success || typeof(JsonDefinitionReader).Assembly.GetType(target.Groups[1].Value.Trim()) is not { IsEnum: true } enumType)
        {
            return null;
        }

        var words = enumType.GetFields(System.Reflection.BindingFlags.Public | System.Reflection.BindingFlags.Static)
            .Select(f => f.GetCustomAttributes(typeof(System.Text.Json.Serialization.JsonStringEnumMemberNameAttribute), false)
                .OfType<System.Text.Json.Serialization.JsonStringEnumMemberNameAttribute>().FirstOrDefault()?.Name ?? f.Name)
            .ToList();
        var what = string.Concat(enumType.Name.Select((c, i) => i > 0 && char.IsUpper(c) ? $" {char.ToLowerInvariant(c)}" : char.ToLowerInvariant(c).ToString()));
        var given = ValueAt(utf8, path);
        return given is null
            ? $"not a known {what} (known: {string.Join(", ", words)})"
            : $"unknown {what} '{given}' (known: {string.Join(", ", words)})";
    }

    /// <summary>The text of the value at a simple JSON path (<c>$.a.b[2].c</c>), or null.</summary>
    private static string? ValueAt(byte[] utf8, string path)
    {
        try
        {
            var node = System.Text.Json.Nodes.JsonNode.Parse(SkipBom(utf8), documentOptions: new JsonDocumentOptions
            {
                CommentHandling = JsonCommentHandling.Skip,
                AllowTrailingCommas = true,
            });
            foreach (Match segment in PathSegment().Matches(path))
            {
                node = segment.Groups["index"].Success
                    ? node?[int.Parse(segment.Groups["index"].Value, System.Globalization.CultureInfo.InvariantCulture)]
                    : node?[segment.Groups["name"].Value];
            }

            return node is System.Text.Json.Nodes.JsonValue value ? value.ToJsonString().Trim('"') : null;
        }
        catch (Exception e) when (e is JsonException or InvalidOperationException or ArgumentException or FormatException)
        {
            return null;
        }
    }

    private static string Describe(string clrType)
    {
        var t = clrType.Trim();
        if (t.Contains("Double", StringComparison.Ordinal) || t.Contains("Int", StringComparison.Ordinal) || t.Contains("Decimal", StringComparison.Ordinal))
        {
            return t.Contains("Int", StringComparison.Ordinal) ? "a whole number" : "a number";
        }

        if (t.Contains("String", StringComparison.Ordinal))
        {
            return "a string";
        }

        if (t.Contains("Boolean", StringComparison.Ordinal))
        {
            return "true or false";
        }

        if (t.Contains("IReadOnlyList", StringComparison.Ordinal) || t.Contains("[]", StringComparison.Ordinal))
        {
            return "an array";
        }

        return "an object";
    }

    private static ReadOnlySpan<byte> SkipBom(byte[] utf8) =>
        utf8.Length >= 3 && utf8[0] == 0xEF && utf8[1] == 0xBB && utf8[2] == 0xBF ? utf8.AsSpan(3) : utf8;

    private const string MissingPrefix = "missing required propert";

    private const string MissingCommaReason = "not valid JSON here: a comma is missing after this value (or a bracket is not closed)";

    [GeneratedRegex(@"\s*Path: .*$", RegexOptions.Singleline)]
    private static partial Regex LocationSuffix();

    [GeneratedRegex(@"missing required properties including: (.*?)\.?$")]
    private static partial Regex MissingRequired();

    [GeneratedRegex(@"The JSON property '([^']*)' could not be mapped")]
    private static partial Regex UnknownProperty();

    [GeneratedRegex(@"type discriminator id '([^']*)'")]
    private static partial Regex UnknownDiscriminator();

    [GeneratedRegex(@"duplicate '([^']*)' metadata property")]
    private static partial Regex DuplicateMetadata();

    [GeneratedRegex(@"'(.)' is an invalid start of a value")]
    private static partial Regex InvalidStart();

    [GeneratedRegex(@"must specify a type discriminator\.?\s*Path: (?<path>\S+)")]
    private static partial Regex MissingDiscriminator();

    [GeneratedRegex(@"\.(?<name>[^.\[]+)|\['(?<quoted>(?:[^'\\]|\\.)*)'\]|\[(?<index>\d+)\]")]
    private static partial Regex PathSegment();

    [GeneratedRegex(@"could not be converted to ([^.\s]+(\.[^.\s]+)*)")]
    private static partial Regex ConvertTarget();
}
