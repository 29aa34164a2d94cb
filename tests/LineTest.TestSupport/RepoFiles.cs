namespace LineTest.TestSupport;

/// <summary>Finds files of the repository (sequences, fixtures) from a test's output folder.</summary>
public static class RepoFiles
{
    private static readonly Lazy<string> RootPath = new(FindRoot);

    /// <summary>The repository root (the folder holding LineTest.sln).</summary>
    public static string Root => RootPath.Value;

    /// <summary>A path below the repository root.</summary>
    public static string Path(string relative) => System.IO.Path.Combine(Root, relative);

    private static string FindRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(System.IO.Path.Combine(dir.FullName, "LineTest.sln")))
        {
            dir = dir.Parent;
        }

        return dir?.FullName ?? throw new InvalidOperationException("LineTest.sln not found above " + AppContext.BaseDirectory);
    }
}
