using System.Globalization;

namespace LineTest.Storage.Locking;

/// <summary>Who holds a results folder's writer lock: a process on a host, since a time (UTC).</summary>
/// <param name="ProcessId">The holder's process id.</param>
/// <param name="Host">The holder's machine name.</param>
/// <param name="SinceUtc">When it took the lock.</param>
public sealed record LockHolder(int ProcessId, string Host, DateTimeOffset SinceUtc)
{
    /// <summary>The one line written to the holder file: <c>pid PID host HOST since TIME</c>.</summary>
    public string ToLine() =>
        string.Create(CultureInfo.InvariantCulture, $"pid {ProcessId} host {Host} since {SinceUtc.UtcDateTime:yyyy-MM-ddTHH:mm:ssZ}");

    /// <summary>Reads a line written by <see cref="ToLine"/>; null when it is not one.</summary>
    public static LockHolder? Parse(string? line)
    {
        var parts = line?.Trim().Split(' ', StringSplitOptions.RemoveEmptyEntries);
        if (parts is not { Length: 6 } || parts[0] != "pid" || parts[2] != "host" || parts[4] != "since")
        {
            return null;
        }

        return int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out var pid)
            && DateTimeOffset.TryParse(parts[5], CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal, out var since)
            ? new LockHolder(pid, parts[3], since)
            : null;
    }
}
