using System.Collections.Concurrent;
using Microsoft.AspNetCore.Http;

namespace LineTest.Web.Hosting;

/// <summary>The page's style sheet and script, embedded in this assembly and served from <c>/assets/</c>.</summary>
internal static class AssetFiles
{
    private static readonly ConcurrentDictionary<string, byte[]?> Cache = new(StringComparer.Ordinal);

    /// <summary>Serves <paramref name="name"/> or 404.</summary>
    public static IResult Serve(string name)
    {
        var type = Path.GetExtension(name) switch
        {
            ".css" => "text/css; charset=utf-8",
            ".js" => "text/javascript; charset=utf-8",
            _ => null,
        };
        if (type is null || Read(name) is not { } bytes)
        {
            return Results.NotFound();
        }

        return Results.Bytes(bytes, type);
    }

    /// <summary>The embedded file's bytes, or null when there is none by that name.</summary>
    public static byte[]? Read(string name) => Cache.GetOrAdd(name, static n =>
    {
        using var stream = typeof(AssetFiles).Assembly.GetManifestResourceStream("LineTest.Web.Assets." + n);
        if (stream is null)
        {
            return null;
        }

        using var copy = new MemoryStream();
        stream.CopyTo(copy);
        return copy.ToArray();
    });
}
