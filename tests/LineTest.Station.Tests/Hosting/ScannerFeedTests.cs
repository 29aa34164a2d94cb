using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Scanner;
using LineTest.Station.Hosting;
using Microsoft.Extensions.Logging.Abstractions;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Station.Tests.Hosting;

public sealed class ScannerFeedTests
{
    // Guards against a hang only; nothing here is timed.
    private static readonly TimeSpan Guard = TimeSpan.FromSeconds(30);

    [Fact]
    public async Task Start_Scans_PostedInOrderBesideTheKeyboard()
    {
        using var input = OperatorInput.FromLines(new OpenKeyboard());
        var scanner = new ScriptedScanner(() => ScanResult.Of("A-1"), () => ScanResult.Rejected("an empty scan"), () => ScanResult.Of("B-2"));

        await using (ScannerFeed.Start(scanner, "/dev/ttyACM0", input, new FakeTimeProvider(), NullLogger.Instance))
        {
            var entries = await ReadAsync(input, 3);

            Assert.All(entries, e => Assert.Equal(OperatorEntryKind.Scanned, e.Kind));
            Assert.Equal(["A-1", null, "B-2"], entries.Select(e => e.Scan!.Serial));
            Assert.Equal("an empty scan", entries[1].Scan!.Problem);
        }
    }

    [Fact]
    public async Task Start_ScannerFaultsThenRecovers_OneNoticeThenBackAndTheScan()
    {
        using var input = OperatorInput.FromLines(new OpenKeyboard());
        var clock = new FakeTimeProvider();
        var lost = new InstrumentFaultException("scanner on /dev/ttyACM0", InstrumentFaultKind.PortLost, "port /dev/ttyACM0 does not exist: check that the scanner is plugged in");
        var scanner = new ScriptedScanner(() => throw lost, () => throw lost, () => throw new InvalidOperationException("driver bug"), () => ScanResult.Of("A-1"));

        await using (ScannerFeed.Start(scanner, "/dev/ttyACM0", input, clock, NullLogger.Instance))
        {
            using var advance = new CancellationTokenSource();
            var ticker = Task.Run(async () =>
            {
                // Each retry waits on the clock; move it on until the scanner has been asked four times.
                while (!advance.IsCancellationRequested)
                {
                    clock.Advance(ScannerFeed.RetryDelay);
                    await Task.Yield();
                }
            });
            var entries = await ReadAsync(input, 3);
            await advance.CancelAsync();
            await ticker;

            Assert.Equal(OperatorEntryKind.ScannerNotice, entries[0].Kind);
            Assert.Contains("port /dev/ttyACM0 does not exist", entries[0].Text, StringComparison.Ordinal);
            Assert.Contains("Type serials on the keyboard meanwhile", entries[0].Text, StringComparison.Ordinal);
            Assert.Equal(OperatorEntry.Notice("The scanner on /dev/ttyACM0 works again."), entries[1]);
            Assert.Equal("A-1", entries[2].Scan!.Serial);
        }
    }

    private static async Task<List<OperatorEntry>> ReadAsync(OperatorInput input, int count)
    {
        using var guard = new CancellationTokenSource(Guard);
        var entries = new List<OperatorEntry>();
        while (entries.Count < count)
        {
            entries.Add((await input.ReadAsync(guard.Token))!);
        }

        return entries;
    }

    /// <summary>A keyboard nobody types on, that stays open.</summary>
    private sealed class OpenKeyboard : TextReader
    {
        public override async ValueTask<string?> ReadLineAsync(CancellationToken cancellationToken)
        {
            await Task.Delay(Timeout.Infinite, cancellationToken);
            return null;
        }
    }

    /// <summary>A scanner that answers from a script, then waits for ever.</summary>
    private sealed class ScriptedScanner(params Func<ScanResult>[] script) : IBarcodeScanner
    {
        private int _calls;

        public async Task<ScanResult> NextAsync(CancellationToken cancellationToken)
        {
            var call = Interlocked.Increment(ref _calls);
            if (call <= script.Length)
            {
                return script[call - 1]();
            }

            await Task.Delay(Timeout.Infinite, cancellationToken);
            return ScanResult.End;
        }
    }
}
