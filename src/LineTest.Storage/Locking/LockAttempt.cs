namespace LineTest.Storage.Locking;

/// <summary>The outcome of taking a results folder's writer lock: the lock, or why not.</summary>
/// <param name="Lock">The lock (dispose it to release), or null when refused.</param>
/// <param name="Refusal">Why the lock was not taken, in words for the person at the station; null when taken.</param>
/// <param name="Holder">The process holding the folder when refused, when it could be read.</param>
public sealed record LockAttempt(ResultsFolderLock? Lock, string? Refusal, LockHolder? Holder)
{
    /// <summary>True when the lock was taken.</summary>
    public bool IsTaken => Lock is not null;
}
