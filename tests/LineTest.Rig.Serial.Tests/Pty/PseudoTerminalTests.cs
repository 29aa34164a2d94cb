using LineTest.Rig.Serial.Pty;

namespace LineTest.Rig.Serial.Tests.Pty;

public sealed class PseudoTerminalTests
{
    [LinuxFact]
    public void Open_WithLink_LinkNamesTheSlaveUntilDisposed()
    {
        using var folder = new PortFolder();
        var link = folder.Port("tty");

        var pty = PseudoTerminal.Open(link);
        var target = File.ResolveLinkTarget(link, returnFinalTarget: false)?.FullName;
        pty.Dispose();

        Assert.StartsWith("/dev/pts/", pty.SlavePath, StringComparison.Ordinal);
        Assert.Equal(pty.SlavePath, target);
        Assert.Equal(link, pty.PortName);
        Assert.False(File.Exists(link));
    }

    [LinuxFact]
    public void WaitReadable_NothingWritten_FalseAfterTheTimeout()
    {
        using var pty = PseudoTerminal.Open();

        Assert.False(pty.WaitReadable(20));
    }
}
