using System.Text;
using CsCheck;
using LineTest.Rig.Serial.Scanner;

namespace LineTest.Rig.Serial.Tests.Scanner;

public sealed class ScanListenerTests
{
    private const int TimeoutMs = 200;

    private static readonly TimeProvider Clock = TimeProvider.System;

    // A serial as the scan rules accept it (SerialText): 1 to 40 of A–Z a–z 0–9 - _ . /
    private static readonly Gen<string> Codes = Gen.String[Gen.OneOf(Gen.Char['A', 'Z'], Gen.Char['a', 'z'], Gen.Char['0', '9'], Gen.OneOf('-', '_', '.', '/')), 1, 40];

    [Fact]
    public void Receive_CodeSplitAcrossListeningSlices_OneScan()
    {
        // Regression: the deadline for a line end used to run from the start of each listening slice, so a code that
        // arrived as a slice ended was cut into an "incomplete" scan and a tail ("12-000042") that passed for a serial.
        var listener = new ScanListener(TimeoutMs, Clock);

        listener.Receive("CTP40A-26"u8, At(990));
        listener.Expire(At(1000));
        listener.Receive("12-000042\r"u8, At(1010));
        listener.Expire(At(1020));

        Assert.True(listener.TryTake(out var scan));
        Assert.Equal("CTP40A-2612-000042", scan.Serial);
        Assert.False(listener.TryTake(out _));
    }

    [Fact]
    public void Receive_TwoCodesInOneChunk_TwoScans()
    {
        // Regression: bytes after the first line end of a read were dropped, losing the second of two quick scans.
        var listener = new ScanListener(TimeoutMs, Clock);

        listener.Receive("CTP40A-2612-000001\r\nCTP40A-2612-000002\r\n"u8, At(0));

        Assert.Equal(["CTP40A-2612-000001", "CTP40A-2612-000002"], TakeAll(listener).Select(s => s.Serial));
    }

    [Fact]
    public void Receive_CarriageReturnOnly_EachCodeAScan()
    {
        // Regression: a scanner set to end codes with CR alone (a common factory setting) had every scan refused as incomplete.
        var listener = new ScanListener(TimeoutMs, Clock);

        listener.Receive("A-1\rB-2\r"u8, At(0));

        Assert.Equal(["A-1", "B-2"], TakeAll(listener).Select(s => s.Serial));
    }

    [Fact]
    public void Expire_NoLineEndWithinTheTimeoutOfTheFirstByte_RefusedWithAdvice()
    {
        var listener = new ScanListener(TimeoutMs, Clock);
        listener.Receive("CTP40A"u8, At(0));

        listener.Expire(At(TimeoutMs - 1));
        Assert.False(listener.TryTake(out _));
        listener.Expire(At(TimeoutMs));

        Assert.True(listener.TryTake(out var scan));
        Assert.Equal("an incomplete scan 'CTP40A' (no line end within 200 ms: set the scanner to send CR or LF after each code)", scan.Problem);
    }

    [Fact]
    public void WaitMs_PartialCode_TimeLeftForIt()
    {
        var listener = new ScanListener(TimeoutMs, Clock);
        Assert.Equal(1000, listener.WaitMs(At(0), 1000));

        listener.Receive("CTP"u8, At(50));

        Assert.Equal(TimeoutMs - 30, listener.WaitMs(At(80), 1000));
        Assert.Equal(1, listener.WaitMs(At(900), 1000));
    }

    [Fact]
    public void Receive_NoiseBetweenCodes_RefusedAndTheCodesKept()
    {
        var listener = new ScanListener(TimeoutMs, Clock);

        listener.Receive([.. "A-1\r"u8, 0x7F, 0x00, 0xE5, 0x13, (byte)'\n', .. "B-2\r"u8], At(0));

        var scans = TakeAll(listener);
        Assert.Equal(["A-1", null, "B-2"], scans.Select(s => s.Serial));
        Assert.Contains("a scan with the non-printable byte 0x7F at position 1", scans[1].Problem, StringComparison.Ordinal);
    }

    [Fact]
    [Trait("Category", "Fuzz")]
    public void Receive_BuiltStreamInRandomChunksAndTimes_ExactlyTheCodesSentAsSerials()
    {
        // Codes, other printable lines, noise, over-long lines and empty lines, each arriving within the timeout of its
        // first byte, in random chunks, with random pauses between lines and Expire calls at every chunk.
        var lines = WireSegments.Segment(ScanListener.MaxLineLength, carriageReturnEndsLine: true, Gen.OneOf(Codes, Gen.String[Gen.Char[' ', '~'], 1, 60]));
        var pieces = Gen.Select(lines, Gen.Int[1, 50].Array[0, 4], Gen.Int[0, 2 * TimeoutMs]);
        pieces.Array[0, 10].Sample(stream =>
        {
            var listener = new ScanListener(TimeoutMs, Clock);
            var now = 0;
            foreach (var (segment, cuts, pause) in stream)
            {
                now += pause;
                var chunks = WireSegments.Chunks(segment.Bytes, cuts);
                for (var i = 0; i < chunks.Count; i++)
                {
                    // The chunks of one line arrive within the timeout of its first byte.
                    var at = now + (i * (TimeoutMs - 1) / Math.Max(1, chunks.Count));
                    listener.Receive(chunks[i], At(at));
                    listener.Expire(At(at));
                }

                now += TimeoutMs;
                listener.Expire(At(now));
            }

            var expected = stream.Select(p => p.Item1).Where(s => s.Kind != SegmentKind.Empty).ToList();
            var scans = TakeAll(listener);
            Assert.Equal(expected.Count, scans.Count);
            foreach (var (segment, scan) in expected.Zip(scans))
            {
                var text = segment.Kind == SegmentKind.Good ? segment.Text! : null;
                var isCode = text is not null && text.Trim().Length is > 0 and <= 40 && text.Trim().All(c => char.IsAsciiLetterOrDigit(c) || c is '-' or '_' or '.' or '/');
                Assert.Equal(isCode ? text!.Trim() : null, scan.Serial);
                Assert.Equal(isCode, scan.Problem is null);
            }
        }, iter: 3000, print: s => string.Join(" | ", s.Select(p => $"{p.Item1.Kind} {WireFuzz.Show(Encoding.Latin1.GetString(p.Item1.Bytes))}")));
    }

    private static long At(int ms) => ms * Clock.TimestampFrequency / 1000;

    private static List<ScanResult> TakeAll(ScanListener listener)
    {
        var scans = new List<ScanResult>();
        while (listener.TryTake(out var scan))
        {
            scans.Add(scan);
        }

        return scans;
    }
}
