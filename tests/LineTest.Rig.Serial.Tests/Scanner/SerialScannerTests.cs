using CsCheck;
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

    [LinuxFact]
    public async Task NextAsync_TwoCodesInOneWriteEndedByCarriageReturn_TwoScans()
    {
        // Regression: a scanner ending codes with CR alone had every scan refused as incomplete, and the second of two
        // codes that arrived in one read was dropped.
        using var folder = new PortFolder();
        var pty = PseudoTerminal.Open(folder.Port("scanner"));
        var scanner = new SerialScanner(new PortDefinition { Name = pty.PortName, TimeoutMs = 2000 }, NullLogger.Instance, TimeProvider.System);
        try
        {
            await WarmUpAsync(scanner, pty);
            pty.Master.Write("CTP40A-2612-000001\rCTP40A-2612-000002\r"u8);

            Assert.Equal("CTP40A-2612-000001", (await scanner.NextAsync(default)).Serial);
            Assert.Equal("CTP40A-2612-000002", (await scanner.NextAsync(default)).Serial);
        }
        finally
        {
            scanner.Dispose();
            pty.Dispose();
        }
    }

    [LinuxFact]
    [Trait("Category", "Fuzz")]
    public async Task NextAsync_BuiltStreamsThroughAPseudoTerminal_ExactlyTheCodesSentAsSerials()
    {
        using var folder = new PortFolder();
        var pty = PseudoTerminal.Open(folder.Port("scanner"));
        var scanner = new SerialScanner(new PortDefinition { Name = pty.PortName, TimeoutMs = 5000 }, NullLogger.Instance, TimeProvider.System);
        var codes = Gen.String[Gen.OneOf(Gen.Char['A', 'Z'], Gen.Char['0', '9'], Gen.Const('-')), 1, 40];
        var stream = Gen.Select(WireSegments.Segment(ScanListener.MaxLineLength, carriageReturnEndsLine: true, Gen.OneOf(codes, Gen.String[Gen.Char[' ', '~'], 1, 60])).Array[1, 8], Gen.Int[1, 400].Array[0, 4]);
        try
        {
            await WarmUpAsync(scanner, pty);

            stream.Sample((segments, cuts) =>
            {
                foreach (var chunk in WireSegments.Chunks(WireSegments.Concat(segments), cuts))
                {
                    pty.Master.Write(chunk);
                }

                foreach (var segment in segments.Where(s => s.Kind != SegmentKind.Empty))
                {
                    var scan = scanner.NextAsync(default).GetAwaiter().GetResult();
                    var text = segment.Text?.Trim();
                    var isCode = text is { Length: > 0 and <= 40 } && text.All(c => char.IsAsciiLetterOrDigit(c) || c is '-' or '_' or '.' or '/');
                    Assert.Equal(isCode ? text : null, scan.Serial);
                    Assert.Equal(isCode, scan.Problem is null);
                }
            }, iter: 40, threads: 1, print: t => string.Join(" | ", t.Item1.Select(s => s.Kind + " " + WireFuzz.Show(System.Text.Encoding.Latin1.GetString(s.Bytes)))));
        }
        finally
        {
            scanner.Dispose();
            pty.Dispose();
        }
    }

    // The scanner opens its port on its first read and then sets the terminal to raw mode; bytes written before that
    // could be changed by the terminal's line discipline (CR to LF). So: wait until the port is open, send one code, and
    // once it has come through the port is certainly set up.
    private static async Task WarmUpAsync(SerialScanner scanner, PseudoTerminal pty)
    {
        var first = scanner.NextAsync(default);
        for (var i = 0; i < 500 && !IsOpenHere(pty.SlavePath); i++)
        {
            await Task.Delay(10);
        }

        pty.Master.Write("WARM-UP\n"u8);
        Assert.Equal("WARM-UP", (await first).Serial);
    }

    private static bool IsOpenHere(string slave)
        => Directory.EnumerateFileSystemEntries("/proc/self/fd").Any(fd => TryTarget(fd) == slave);

    private static string? TryTarget(string fd)
    {
        try
        {
            return File.ResolveLinkTarget(fd, returnFinalTarget: false)?.FullName;
        }
        catch (IOException)
        {
            return null;
        }
    }
}
