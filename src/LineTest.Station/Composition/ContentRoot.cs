namespace LineTest.Station.Composition;

/// <summary>
/// Where appsettings.json (and the relative paths in it) are found: the current directory when it holds
/// appsettings.json (the usual case: started from the repository or an installed station folder), otherwise the
/// folder of the executable, where the build copies appsettings.json, sequences/ and fixtures/.
/// </summary>
public static class ContentRoot
{
    /// <summary>The folder to read appsettings.json from.</summary>
    public static string Find()
    {
        var current = Directory.GetCurrentDirectory();
        return File.Exists(Path.Combine(current, "appsettings.json")) ? current : AppContext.BaseDirectory;
    }

    /// <summary>Resolves a path from appsettings.json against <paramref name="root"/>.</summary>
    public static string Resolve(string root, string path) =>
        Path.IsPathRooted(path) ? path : Path.GetFullPath(Path.Combine(root, path));
}
