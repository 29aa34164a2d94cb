using System.Text;
using System.Text.Json.Nodes;

namespace LineTest.Station.Campaign;

/// <summary>
/// Makes damaged copies of a good sequence or fixture file, the way files get damaged: flipped bytes, a truncated
/// copy, inserted junk, a value of the wrong type or range, a removed key or element. Seeded and repeatable.
/// </summary>
internal sealed class DefinitionMutator(int seed)
{
    private readonly Random _random = new(seed);

    /// <summary>One damaged copy of <paramref name="original"/>.</summary>
    public byte[] Mutate(byte[] original) => original.Length == 0 ? InsertJunk(original) : _random.Next(5) switch
    {
        0 => FlipBytes(original),
        1 => original[.._random.Next(original.Length)],
        2 => InsertJunk(original),
        3 => Structured(ReplaceValue, original) ?? FlipBytes(original),
        _ => Structured(RemoveMember, original) ?? FlipBytes(original),
    };

    /// <summary>A structured edit, or null when the bytes are no longer JSON the editor can walk (e.g. not UTF-8 after a flip).</summary>
    private static byte[]? Structured(Func<byte[], byte[]?> edit, byte[] original)
    {
        try
        {
            return edit(original);
        }
        catch (Exception ex) when (ex is System.Text.Json.JsonException or InvalidOperationException or ArgumentException)
        {
            return null;
        }
    }

    private byte[] FlipBytes(byte[] original)
    {
        var copy = (byte[])original.Clone();
        var flips = 1 + _random.Next(8);
        for (var i = 0; i < flips; i++)
        {
            copy[_random.Next(copy.Length)] ^= (byte)(1 + _random.Next(255));
        }

        return copy;
    }

    private byte[] InsertJunk(byte[] original)
    {
        var junk = new byte[1 + _random.Next(16)];
        _random.NextBytes(junk);
        var at = _random.Next(original.Length + 1);
        return [.. original[..at], .. junk, .. original[at..]];
    }

    private byte[]? ReplaceValue(byte[] original)
    {
        var root = Parse(original);
        if (root is null)
        {
            return null;
        }

        var nodes = Descendants(root).Where(n => n.Parent is not null).ToList();
        if (nodes.Count == 0)
        {
            return null;
        }

        var node = nodes[_random.Next(nodes.Count)];
        var value = RandomValue();
        switch (node.Parent)
        {
            case JsonObject parent:
                parent[node.GetPropertyName()] = value;
                break;
            case JsonArray array:
                array[node.GetElementIndex()] = value;
                break;
        }

        return Encoding.UTF8.GetBytes(root.ToJsonString());
    }

    private byte[]? RemoveMember(byte[] original)
    {
        var root = Parse(original);
        if (root is null)
        {
            return null;
        }

        var nodes = Descendants(root).Where(n => n.Parent is not null).ToList();
        if (nodes.Count == 0)
        {
            return null;
        }

        var node = nodes[_random.Next(nodes.Count)];
        switch (node.Parent)
        {
            case JsonObject parent:
                parent.Remove(node.GetPropertyName());
                break;
            case JsonArray array:
                array.RemoveAt(node.GetElementIndex());
                break;
        }

        return Encoding.UTF8.GetBytes(root.ToJsonString());
    }

    private JsonNode? RandomValue() => _random.Next(12) switch
    {
        0 => null,
        1 => JsonValue.Create(true),
        2 => JsonValue.Create(-1),
        3 => JsonValue.Create(0),
        4 => JsonValue.Create(1e308),
        5 => JsonValue.Create(-1e308),
        6 => JsonValue.Create(long.MaxValue),
        7 => JsonValue.Create(new string('x', _random.Next(0, 300))),
        8 => new JsonArray(JsonValue.Create(_random.Next())),
        9 => new JsonObject { ["unexpected"] = _random.Next() },
        10 => JsonValue.Create("NaN"),
        _ => JsonValue.Create((_random.NextDouble() - 0.5) * Math.Pow(10, _random.Next(-10, 12))),
    };

    private static JsonNode? Parse(byte[] utf8)
    {
        try
        {
            return JsonNode.Parse(utf8, documentOptions: new System.Text.Json.JsonDocumentOptions { CommentHandling = System.Text.Json.JsonCommentHandling.Skip, AllowTrailingCommas = true });
        }
        catch (System.Text.Json.JsonException)
        {
            return null;
        }
    }

    private static IEnumerable<JsonNode> Descendants(JsonNode node)
    {
        yield return node;
        IEnumerable<JsonNode?> children = node switch
        {
            JsonObject o => o.Select(p => p.Value),
            JsonArray a => a,
            _ => [],
        };
        foreach (var child in children)
        {
            if (child is null)
            {
                continue;
            }

            foreach (var d in Descendants(child))
            {
                yield return d;
            }
        }
    }
}
