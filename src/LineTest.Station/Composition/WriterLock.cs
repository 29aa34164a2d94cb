using LineTest.Storage.Locking;

namespace LineTest.Station.Composition;

/// <summary>
/// Takes the results folder's writer lock for a command that writes (<c>run</c>, <c>demo</c>, <c>campaign</c>, <c>release</c>)
/// before it does anything else, so a second writer on the folder stops at once with who holds it. The lock is held until
/// the command ends (or its process dies).
/// </summary>
public static class WriterLock
{
    /// <summary>The lock, or null after writing <c>linetest: results folder R is in use by process PID on HOST since TIME</c> to <paramref name="error"/>.</summary>
    public static ResultsFolderLock? TakeOrRefuse(string resultsFolder, TimeProvider clock, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(error);
        var attempt = ResultsFolderLock.TryAcquire(resultsFolder, clock);
        if (attempt.Lock is null)
        {
            error.WriteLine($"linetest: {attempt.Refusal}");
        }

        return attempt.Lock;
    }
}
