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
        var locator = JsonLocator.Build(utf8);
        try
        {
            var value = JsonSerializer.Deserialize<T>(SkipBom(utf8), LineTestJson.Definitions);
            if (value is null)
            {
                return new ParsedDefinition<T>(null, [new DefinitionProblem(file, 1, "$", "the file holds null instead of an object")], sha, locator);
            }

            return new ParsedDefinition<T>(value, [], sha, locator);
        }
        catch (JsonException ex)
        {
            var path = string.IsNullOrEmpty(ex.Path) ? "$" : ex.Path;
            int? line = ex.LineNumber is { } l ? checked((int)l + 1) : locator.LineOf(path);
            return new ParsedDefinition<T>(null, [new DefinitionProblem(file, line, path, PlainReason(ex))], sha, locator);
        }
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
    internal static string PlainReason(JsonException ex)
    {
        var message = LocationSuffix().Replace(ex.Message, string.Empty).Trim();
        if (MissingRequired().Match(message) is { Success: true } missing)
        {
            return $"missing required property {missing.Groups[1].Value.Trim()}";
        }

        if (UnknownProperty().Match(message) is { Success: true } unknown)
        {
            return $"unknown property '{unknown.Groups[1].Value}' (check the spelling; keys are camelCase)";
        }

        if (UnknownDiscriminator().Match(message) is { Success: true } kind)
        {
            return $"unknown kind '{kind.Groups[1].Value}'";
        }

        if (message.Contains("could not be converted to", StringComparison.Ordinal))
        {
            var target = ConvertTarget().Match(message);
            var expected = target.Success ? Describe(target.Groups[1].Value) : "a different type of value";
            return $"expected {expected}";
        }

        if (message.Contains("null", StringComparison.OrdinalIgnoreCase) && message.Contains("non-nullable", StringComparison.OrdinalIgnoreCase))
        {
            return "a value is required here, not null";
        }

        if (ex.InnerException is { } inner && message.Length == 0)
        {
            return inner.Message;
        }

        return $"not valid JSON here: {message}";
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

    [GeneratedRegex(@"\s*Path: .*$", RegexOptions.Singleline)]
    private static partial Regex LocationSuffix();

    [GeneratedRegex(@"missing required properties including: (.*?)\.?$")]
    private static partial Regex MissingRequired();

    [GeneratedRegex(@"The JSON property '([^']*)' could not be mapped")]
    private static partial Regex UnknownProperty();

    [GeneratedRegex(@"type discriminator id '([^']*)'")]
    private static partial Regex UnknownDiscriminator();

    [GeneratedRegex(@"could not be converted to ([^.\s]+(\.[^.\s]+)*)")]
    private static partial Regex ConvertTarget();
}
