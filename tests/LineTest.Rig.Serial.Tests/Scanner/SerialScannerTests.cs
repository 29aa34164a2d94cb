using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Pty;
using LineTest.Rig.Serial.Scanner;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Rig.Serial.Tests.Scanner;

public sealed class SerialScannerTests
{
    [LinuxFact]
    public async Task NextAsync_LinesFromTheScanner_SerialThenRejectedGarbage()
    {
        using var folder = new PortFolder();
        var pty = PseudoTerminal.Open(folder.Port("scanner"));
        var scanner = new SerialScanner(new PortDefinition { Name = pty.PortName, TimeoutMs = 200 }, NullLogger.Instance, TimeProvider.System);
        try
        {
            var first = scanner.NextAsync(default);
            await Task.Delay(300);
            pty.Master.Write("CTP40A-2612-000042\r\n"u8);
            var serial = await first;
            pty.Master.Write([0x43, 0x00, 0x54, (byte)'\n']);
            var garbage = await scanner.NextAsync(default);

            Assert.Equal("CTP40A-2612-000042", serial.Serial);
            Assert.Contains("non-printable byte 0x00", garbage.Problem, StringComparison.Ordinal);
        }
        finally
        {
            scanner.Dispose();
            pty.Dispose();
        }
    }

    [LinuxFact]
    public async Task NextAsync_PortMissing_PortLostFault()
    {
        using var folder = new PortFolder();
        using var scanner = new SerialScanner(new PortDefinition { Name = folder.Port("none"), TimeoutMs = 100 }, NullLogger.Instance, TimeProvider.System);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => scanner.NextAsync(default));

        Assert.Equal(InstrumentFaultKind.PortLost, fault.Kind);
        Assert.Contains("does not exist", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task NextAsync_Cancelled_StopsWaiting()
    {
        using var folder = new PortFolder();
        var pty = PseudoTerminal.Open(folder.Port("scanner"));
        var scanner = new SerialScanner(new PortDefinition { Name = pty.PortName, TimeoutMs = 100 }, NullLogger.Instance, TimeProvider.System);
        try
        {
            using var cancel = new CancellationTokenSource(TimeSpan.FromMilliseconds(300));
            await Assert.ThrowsAnyAsync<OperationCanceledException>(() => scanner.NextAsync(cancel.Token));
        }
        finally
        {
            scanner.Dispose();
            pty.Dispose();
        }
    }
}
