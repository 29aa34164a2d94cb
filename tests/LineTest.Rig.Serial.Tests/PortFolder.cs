namespace LineTest.Rig.Serial.Tests;

/// <summary>A fresh temporary folder for the symbolic links that name simulated ports; removed on dispose.</summary>
internal sealed class PortFolder : IDisposable
{
    public PortFolder()
    {
        Path = Directory.CreateTempSubdirectory("linetest-ports-").FullName;
    }

    public string Path { get; }

    public string Port(string name) => System.IO.Path.Combine(Path, name);

    public void Dispose()
    {
        try
        {
            Directory.Delete(Path, recursive: true);
        }
        catch (IOException)
        {
            // Best effort: a leftover empty folder in /tmp does no harm.
        }
    }
}
