namespace LineTest.Station.Cli;

/// <summary>Disposes several things together, in reverse order (the demo's writer locks, one per station folder).</summary>
internal sealed class DisposableSet(IReadOnlyList<IDisposable> items) : IDisposable
{
    public void Dispose()
    {
        for (var i = items.Count - 1; i >= 0; i--)
        {
            items[i].Dispose();
        }
    }
}
