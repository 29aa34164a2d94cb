namespace LineTest.TestSupport;

/// <summary>Arbitrary but valid values for tests that do not care about the exact value.</summary>
public static class Some
{
    private static int _counter;

    /// <summary>A fresh serial in the demo product's format.</summary>
    public static string Serial() => $"CTP40-{Interlocked.Increment(ref _counter):D6}";

    /// <summary>A fresh temporary directory that exists.</summary>
    public static string TempDirectory()
    {
        var path = Path.Combine(Path.GetTempPath(), "linetest-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(path);
        return path;
    }
}
