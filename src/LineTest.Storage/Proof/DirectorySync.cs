using System.Runtime.InteropServices;

namespace LineTest.Storage.Proof;

/// <summary>
/// Flushes a folder's entries to the disk, so that a rename inside it survives a power cut (POSIX <c>fsync</c> on the
/// folder). Windows keeps file-system metadata in its own journal and needs no call here.
/// </summary>
internal static partial class DirectorySync
{
    public static void Flush(string folder)
    {
        if (OperatingSystem.IsWindows())
        {
            return;
        }

        var fd = Open(folder, 0);
        if (fd < 0)
        {
            throw new IOException($"The folder '{folder}' cannot be opened to flush it (errno {Marshal.GetLastPInvokeError()}).");
        }

        try
        {
            if (Fsync(fd) != 0)
            {
                throw new IOException($"The folder '{folder}' cannot be flushed to the disk (errno {Marshal.GetLastPInvokeError()}).");
            }
        }
        finally
        {
            _ = Close(fd);
        }
    }

    [LibraryImport("libc", EntryPoint = "open", SetLastError = true, StringMarshalling = StringMarshalling.Utf8)]
    private static partial int Open(string path, int flags);

    [LibraryImport("libc", EntryPoint = "fsync", SetLastError = true)]
    private static partial int Fsync(int fd);

    [LibraryImport("libc", EntryPoint = "close", SetLastError = true)]
    private static partial int Close(int fd);
}
