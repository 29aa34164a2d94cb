using System.Globalization;

namespace LineTest.Storage.Locking;

/// <summary>
/// One writer per results folder: an exclusive operating-system lock on <c>results.lock</c> in the folder, held until
/// disposed or until the process ends (the operating system drops it when the process dies, so a killed station needs no
/// clean-up). Who holds it is written to <c>results.writer</c> beside it, so a refused start can name the holder.
/// </summary>
/// <remarks>
/// The lock belongs to the process: taking it again in the same process (the command, then the result store it opens)
/// shares the one operating-system lock and counts references; the last reference released drops it. The lock file is
/// never deleted: deleting a lock file while another process is opening it would let two processes each lock a
/// different file of the same name. On Linux and macOS the lock is <c>flock</c> (taken by <see cref="FileShare.None"/>),
/// on Windows the file's sharing mode; both end with the process.
/// </remarks>
public sealed class ResultsFolderLock : IDisposable
{
    /// <summary>The lock file's name inside the results folder.</summary>
    public const string LockFileName = "results.lock";

    /// <summary>The holder file's name inside the results folder (one line: <see cref="LockHolder.ToLine"/>).</summary>
    public const string HolderFileName = "results.writer";

    // Guards Held; one entry per folder this process has locked.
    private static readonly Lock Gate = new();
    private static readonly Dictionary<string, Entry> Held = new(OperatingSystem.IsWindows() ? StringComparer.OrdinalIgnoreCase : StringComparer.Ordinal);

    private readonly Entry _entry;
    private bool _disposed;

    private ResultsFolderLock(Entry entry)
    {
        _entry = entry;
    }

    /// <summary>The results folder (full path).</summary>
    public string Folder => _entry.Folder;

    /// <summary>This process, as written to the holder file.</summary>
    public LockHolder Holder => _entry.Holder;

    /// <summary>
    /// Takes the writer lock of <paramref name="resultsFolder"/> (creating the folder if needed), or says at once who
    /// holds it: <c>results folder R is in use by process PID on HOST since TIME</c>. Never waits for the holder.
    /// </summary>
    public static LockAttempt TryAcquire(string resultsFolder, TimeProvider clock)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsFolder);
        ArgumentNullException.ThrowIfNull(clock);
        var folder = Path.GetFullPath(resultsFolder);
        lock (Gate)
        {
            if (Held.TryGetValue(folder, out var held))
            {
                held.References++;
                return new LockAttempt(new ResultsFolderLock(held), null, null);
            }

            FileStream stream;
            try
            {
                Directory.CreateDirectory(folder);
                stream = new FileStream(Path.Combine(folder, LockFileName), FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);
            }
            catch (IOException ex) when (ex is not (DirectoryNotFoundException or PathTooLongException) && File.Exists(Path.Combine(folder, LockFileName)))
            {
                var holder = ReadHolder(folder);
                var refusal = holder is null
                    ? $"results folder {folder} is in use by another process (who holds it could not be read from {Path.Combine(folder, HolderFileName)})"
                    : string.Create(CultureInfo.InvariantCulture, $"results folder {folder} is in use by process {holder.ProcessId} on {holder.Host} since {holder.SinceUtc.UtcDateTime:yyyy-MM-dd HH:mm:ss} UTC");
                return new LockAttempt(null, refusal, holder);
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                return new LockAttempt(null, $"results folder {folder} cannot be locked for writing ({ex.Message}); choose a writable folder", null);
            }

            var me = new LockHolder(Environment.ProcessId, Environment.MachineName, clock.GetUtcNow());
            WriteHolder(folder, stream, me);
            var entry = new Entry(folder, stream, me);
            Held.Add(folder, entry);
            return new LockAttempt(new ResultsFolderLock(entry), null, null);
        }
    }

    /// <summary>True when this process holds the writer lock of <paramref name="resultsFolder"/>.</summary>
    public static bool IsHeldHere(string resultsFolder)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsFolder);
        lock (Gate)
        {
            return Held.ContainsKey(Path.GetFullPath(resultsFolder));
        }
    }

    /// <summary>Releases this reference; the last one releases the operating-system lock.</summary>
    public void Dispose()
    {
        lock (Gate)
        {
            if (_disposed)
            {
                return;
            }

            _disposed = true;
            if (--_entry.References == 0)
            {
                Held.Remove(_entry.Folder);
                _entry.Stream.Dispose();
            }
        }
    }

    private static void WriteHolder(string folder, FileStream stream, LockHolder me)
    {
        var line = me.ToLine() + "\n";
        try
        {
            // The lock file itself says who holds it too, for a person with a shell; the holder file is what a refused
            // LineTest reads (a locked file cannot be opened by another .NET process).
            var bytes = System.Text.Encoding.UTF8.GetBytes(line);
            stream.SetLength(0);
            stream.Write(bytes);
            stream.Flush(flushToDisk: false);
            var temp = Path.Combine(folder, $"{HolderFileName}.{me.ProcessId}.tmp");
            File.WriteAllText(temp, line);
            File.Move(temp, Path.Combine(folder, HolderFileName), overwrite: true);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // Who holds the lock is a courtesy for the refused; the lock itself is taken.
        }
    }

    private static LockHolder? ReadHolder(string folder)
    {
        // The holder writes its line right after taking the lock: give it a moment when the line is not there yet.
        for (var attempt = 0; attempt < 20; attempt++)
        {
            try
            {
                if (LockHolder.Parse(File.ReadAllText(Path.Combine(folder, HolderFileName))) is { } holder)
                {
                    return holder;
                }
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                // Not written yet, or being replaced: try again.
            }

            Thread.Sleep(50);
        }

        return null;
    }

    /// <summary>One folder locked by this process.</summary>
    private sealed class Entry(string folder, FileStream stream, LockHolder holder)
    {
        public string Folder { get; } = folder;

        public FileStream Stream { get; } = stream;

        public LockHolder Holder { get; } = holder;

        // Guarded by Gate.
        public int References { get; set; } = 1;
    }
}
