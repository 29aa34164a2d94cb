using System.Runtime.InteropServices;
using System.Text;
using Microsoft.Win32.SafeHandles;

namespace LineTest.Rig.Serial.Pty;

/// <summary>
/// A pseudo-terminal pair: the slave end (<see cref="SlavePath"/>, e.g. <c>/dev/pts/7</c>) opens like a serial port,
/// the master end is <see cref="Master"/>, a stream on which a simulated instrument reads commands and writes replies.
/// Optionally a symbolic link (<see cref="LinkPath"/>) names the slave, so that a port can be "unplugged" and
/// "plugged in again" under the same name, as a USB adapter is.
/// </summary>
/// <remarks>
/// Linux only. Close every <see cref="System.IO.Ports.SerialPort"/> on the slave before disposing of this object:
/// closing the master first can leave the serial port hanging in <c>Write</c> or <c>Close</c>.
/// </remarks>
public sealed class PseudoTerminal : IDisposable
{
    private const int HangUpPauseMs = 5;

    private readonly int _fd;
    private bool _disposed;

    private PseudoTerminal(int fd, string slavePath, string? linkPath)
    {
        _fd = fd;
        SlavePath = slavePath;
        LinkPath = linkPath;
        // bufferSize 0: no FileStream buffering, so every Write reaches the terminal at once.
        Master = new FileStream(new SafeFileHandle(fd, ownsHandle: true), FileAccess.ReadWrite, bufferSize: 0, isAsync: false);
    }

    /// <summary>Path of the slave end.</summary>
    public string SlavePath { get; }

    /// <summary>The symbolic link that names the slave, or null.</summary>
    public string? LinkPath { get; }

    /// <summary>The name a serial port should open: the link if there is one, else the slave.</summary>
    public string PortName => LinkPath ?? SlavePath;

    /// <summary>The master end.</summary>
    public FileStream Master { get; }

    /// <summary>True where pseudo-terminals can be opened (Linux).</summary>
    public static bool IsSupported => OperatingSystem.IsLinux();

    /// <summary>Opens a new pair; with <paramref name="linkPath"/>, (re)points that symbolic link at the slave.</summary>
    /// <exception cref="PlatformNotSupportedException">Not on Linux.</exception>
    /// <exception cref="IOException">The pair could not be opened.</exception>
    public static unsafe PseudoTerminal Open(string? linkPath = null)
    {
        if (!IsSupported)
        {
            throw new PlatformNotSupportedException("Pseudo-terminal serial ports need Linux.");
        }

        var fd = PtyNative.posix_openpt(PtyNative.OpenReadWriteNoControllingTerminal);
        if (fd < 0)
        {
            throw new IOException($"posix_openpt failed (errno {Marshal.GetLastPInvokeError()}).");
        }

        try
        {
            if (PtyNative.grantpt(fd) != 0 || PtyNative.unlockpt(fd) != 0)
            {
                throw new IOException($"grantpt/unlockpt failed (errno {Marshal.GetLastPInvokeError()}).");
            }

            var buffer = stackalloc byte[256];
            if (PtyNative.ptsname_r(fd, buffer, 256) != 0)
            {
                throw new IOException($"ptsname_r failed (errno {Marshal.GetLastPInvokeError()}).");
            }

            var slave = Encoding.ASCII.GetString(MemoryMarshal.CreateReadOnlySpanFromNullTerminated(buffer));
            if (linkPath is not null)
            {
                File.Delete(linkPath);
                File.CreateSymbolicLink(linkPath, slave);
            }

            return new PseudoTerminal(fd, slave, linkPath);
        }
        catch
        {
            _ = PtyNative.close(fd);
            throw;
        }
    }

    /// <summary>
    /// Waits up to <paramref name="timeoutMs"/> for bytes from the slave side. Returns true when bytes can be read;
    /// false on timeout, or after a short pause while no slave is open.
    /// </summary>
    public unsafe bool WaitReadable(int timeoutMs)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        var fds = new PtyNative.PollFd { Fd = _fd, Events = PtyNative.PollIn };
        var result = PtyNative.poll(&fds, 1, timeoutMs);
        if (result <= 0)
        {
            return false;
        }

        if ((fds.REvents & PtyNative.PollIn) != 0)
        {
            return true;
        }

        // Hang-up: no slave is open just now (closed by the driver, or not yet opened). Poll reports it at once;
        // pause briefly so as not to spin, but not so long that a driver opening the port waits for its first reply.
        Thread.Sleep(Math.Min(timeoutMs, HangUpPauseMs));
        return false;
    }

    /// <summary>Closes the master end (the slave disappears) and removes the link.</summary>
    public void Dispose()
    {
        if (_disposed)
        {
            return;
        }

        _disposed = true;
        Master.Dispose();
        if (LinkPath is null)
        {
            return;
        }

        try
        {
            // Only our own link: after a replug the same name may already point at a newer terminal.
            if (File.ResolveLinkTarget(LinkPath, returnFinalTarget: false)?.FullName == SlavePath)
            {
                File.Delete(LinkPath);
            }
        }
        catch (IOException)
        {
            // The link is already gone.
        }
    }
}
