using System.Runtime.InteropServices;

namespace LineTest.Rig.Serial.Pty;

/// <summary>The few libc calls a pseudo-terminal pair needs (POSIX.1-2008 posix_openpt, grantpt, unlockpt; ptsname_r; poll).</summary>
internal static partial class PtyNative
{
    /// <summary>O_RDWR | O_NOCTTY on Linux: open read-write and do not make the terminal our controlling terminal.</summary>
    public const int OpenReadWriteNoControllingTerminal = 0x2 | 0x100;

    /// <summary>poll(2) event bits (Linux values).</summary>
    public const short PollIn = 0x1;

    public const short PollHangUp = 0x10;

    [LibraryImport("libc", SetLastError = true)]
    public static partial int posix_openpt(int flags);

    [LibraryImport("libc", SetLastError = true)]
    public static partial int grantpt(int fd);

    [LibraryImport("libc", SetLastError = true)]
    public static partial int unlockpt(int fd);

    [LibraryImport("libc", SetLastError = true)]
    public static unsafe partial int ptsname_r(int fd, byte* buffer, nuint length);

    [LibraryImport("libc", SetLastError = true)]
    public static unsafe partial int poll(PollFd* fds, nuint count, int timeoutMs);

    [LibraryImport("libc", SetLastError = true)]
    public static partial int close(int fd);

    /// <summary>struct pollfd.</summary>
    [StructLayout(LayoutKind.Sequential)]
    public struct PollFd
    {
        public int Fd;
        public short Events;
        public short REvents;
    }
}
