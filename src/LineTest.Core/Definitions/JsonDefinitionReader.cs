using System.Security.Cryptography;
using System.Text.Json;

namespace LineTest.Core.Definitions;

/// <summary>
/// Reads a definition file's bytes (sequence or fixture) into typed records. The caller reads the file (Core does no
/// I/O); the text is scanned once (<see cref="JsonScan"/>: document, line map, strict JSON), the document is checked
/// against the model's shape (<see cref="ShapeCheck"/>), and a document with no problem is turned into records; one with
/// problems is repaired where it broke and read as <see cref="ParsedDefinition{T}.Salvaged"/>, so the parts that parsed
/// can still be checked for sense.
/// Every problem has the file, a line and a JSON path from the reader's own positions, and a plain reason.
/// </summary>
public static class JsonDefinitionReader
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
            // Bytes that are not UTF-8 (a file damaged on disk or saved in another encoding): say where, as for any
            // other mistake in the file.
            var badLine = 1 + text[..bad].Count((byte)'\n');
            return Failed<T>(file, sha, new JsonLocator(),
                [("$", badLine, $"byte {bad} is not valid UTF-8 text; save the file as UTF-8 (it may be damaged or in another encoding)")]);
        }

        var scan = JsonScan.Read(text);
        if (!scan.Complete)
        {
            return Failed<T>(file, sha, scan.Locator, scan.Problems);
        }

        if (scan.Root is null)
        {
            return Failed<T>(file, sha, scan.Locator, [.. scan.Problems, ("$", 1, "the file holds null instead of an object")]);
        }

        var shape = new ProblemList();
        var repair = new ShapeRepair();
        ShapeCheck.Check(scan.Root, typeof(T), LineTestJson.Definitions, shape, repair);
        if (scan.Problems.Count > 0 || shape.Items.Count > 0)
        {
            // The document is now repaired (placeholders and defaults where it was broken): read it for the semantic
            // checks of the parts that parsed; a document that still cannot be read gives its own problems only.
            var located = scan.Problems.Select(p => new DefinitionProblem(file, p.Line, p.Path, p.Reason)).Concat(shape.Locate(file, scan.Locator));
            return new ParsedDefinition<T>(null, [.. located.OrderBy(p => p.Line ?? 0)], sha, scan.Locator)
            {
                Salvaged = repair.BrokenPaths.Contains("$") ? null : TryRead<T>(scan.Root, out _),
                BrokenPaths = repair.BrokenPaths,
            };
        }

        var value = TryRead<T>(scan.Root, out var failure);
        if (failure is { } ex)
        {
            // The shape check mirrors the model, so this is a gap in it: still a located problem, never a crash. The
            // serialiser's message is for developers and is not shown.
            var path = ex is JsonException { Path: { Length: > 0 } p } ? p : "$";
            return Failed<T>(file, sha, scan.Locator, [(path, scan.Locator.LineOf(path) ?? 1, "this value cannot be read here (check its type against the schema)")]);
        }

        return value is null
            ? Failed<T>(file, sha, scan.Locator, [("$", 1, "the file holds null instead of an object")])
            : new ParsedDefinition<T>(value, [], sha, scan.Locator);
    }

    private static T? TryRead<T>(System.Text.Json.Nodes.JsonNode root, out Exception? failure)
        where T : class
    {
        failure = null;
        try
        {
            return root.Deserialize<T>(LineTestJson.Definitions);
        }
        catch (Exception ex) when (ex is JsonException or NotSupportedException or InvalidOperationException or FormatException)
        {
            failure = ex;
            return null;
        }
    }

    /// <summary>The text after a UTF-8 byte-order mark, which editors on Windows like to write; it precedes line 1.</summary>
    internal static ReadOnlySpan<byte> SkipBom(ReadOnlySpan<byte> utf8) =>
        utf8.StartsWith((ReadOnlySpan<byte>)[0xEF, 0xBB, 0xBF]) ? utf8[3..] : utf8;

    private static ParsedDefinition<T> Failed<T>(string file, string sha, JsonLocator locator, IEnumerable<(string Path, int Line, string Reason)> problems)
        where T : class =>
        new(null, [.. problems.Select(p => new DefinitionProblem(file, p.Line, p.Path, p.Reason)).OrderBy(p => p.Line)], sha, locator);

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
}
