using CsCheck;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class LineAssemblerTests
{
    private const int MaxLength = 24;

    [Theory]
    [InlineData("OK\n", "OK")]
    [InlineData("OK\r\n", "OK")]
    [InlineData("\n", "")]
    public void Take_InstrumentLine_LineWithoutItsEnd(string bytes, string line)
        => Assert.Equal(line, Assert.Single(Feed(new LineAssembler(MaxLength, false, "reply"), bytes)).Line);

    [Fact]
    public void Take_CarriageReturnInsideAnInstrumentLine_NonPrintable()
        => Assert.Contains("non-printable byte 0x0D at position 3", Assert.Single(Feed(new LineAssembler(MaxLength, false, "reply"), "OK\r?\n")).Problem, StringComparison.Ordinal);

    [Theory]
    [InlineData("A-1\rB-2\r")]
    [InlineData("A-1\nB-2\n")]
    [InlineData("A-1\r\nB-2\r\n")]
    [InlineData("\r\n\rA-1\r\r\nB-2\n\n")]
    public void Take_ScannerLineEnds_EachCodeOnceAndNoEmptyLines(string bytes)
        => Assert.Equal(["A-1", "B-2"], Feed(new LineAssembler(MaxLength, true, "scan"), bytes).Select(r => r.Line));

    [Fact]
    public void Take_OverLongLine_RefusedOnceAndItsTailDropped()
    {
        var results = Feed(new LineAssembler(MaxLength, true, "scan"), new string('X', MaxLength + 5) + "CTP40A-1\rCTP40A-2\r");

        Assert.Equal(2, results.Count);
        Assert.Contains("a scan longer than 24 characters", results[0].Problem, StringComparison.Ordinal);
        Assert.Equal("CTP40A-2", results[1].Line);
    }

    [Fact]
    public void Abandon_UnfinishedLine_IncompleteWithItsBytes()
    {
        var assembler = new LineAssembler(MaxLength, false, "reply");
        Assert.Empty(Feed(assembler, "7.2\0"));

        Assert.Equal("an incomplete reply '7.2<00>' (no line end within 100 ms)", assembler.Abandon(100)!.Problem);
        Assert.False(assembler.HasPartial);
        Assert.Null(assembler.Abandon(100));
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    [Trait("Category", "Fuzz")]
    public void Take_StreamOfBuiltSegments_EachBecomesWhatTheRulesSay(bool carriageReturnEndsLine)
        => WireSegments.Segment(MaxLength, carriageReturnEndsLine).Array[0, 12].Sample(segments =>
        {
            var results = Feed(new LineAssembler(MaxLength, carriageReturnEndsLine, carriageReturnEndsLine ? "scan" : "reply"), WireSegments.Concat(segments));

            var expected = segments.Where(s => s.Kind != SegmentKind.Empty).ToList();
            Assert.Equal(expected.Count, results.Count);
            foreach (var (segment, result) in expected.Zip(results))
            {
                if (segment.Kind == SegmentKind.Good)
                {
                    Assert.Equal(segment.Text, result.Line);
                }
                else
                {
                    Assert.Null(result.Line);
                    Assert.Contains(segment.Kind == SegmentKind.TooLong ? "longer than" : $"non-printable byte 0x{segment.FirstBad:X2}", result.Problem, StringComparison.Ordinal);
                }
            }
        }, iter: 5000, print: Describe);

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    [Trait("Category", "Fuzz")]
    public void Take_AnyBytes_OnlyPrintableBoundedLinesAndNeverAnException(bool carriageReturnEndsLine)
        => Gen.Byte.Array[0, 200].Sample(bytes =>
        {
            var assembler = new LineAssembler(MaxLength, carriageReturnEndsLine, "reply");
            foreach (var b in bytes)
            {
                if (assembler.Take(b) is { Line: { } line })
                {
                    Assert.True(line.Length <= MaxLength, line);
                    Assert.All(line, c => Assert.True(c is '\t' or >= ' ' and <= '~', WireFuzz.Show(line)));
                }
            }

            var abandoned = assembler.Abandon(10);
            Assert.True(abandoned is null or { Line: null, Problem: not null });
            Assert.False(assembler.HasPartial);
        }, iter: 5000);

    private static string Describe(Segment[] segments) => string.Join(" | ", segments.Select(s => $"{s.Kind} [{string.Join(' ', s.Bytes.Select(b => b.ToString("X2", System.Globalization.CultureInfo.InvariantCulture)))}]"));

    private static List<LineRead> Feed(LineAssembler assembler, string text) => Feed(assembler, text.Select(c => (byte)c).ToArray());

    private static List<LineRead> Feed(LineAssembler assembler, byte[] bytes)
    {
        var results = new List<LineRead>();
        foreach (var b in bytes)
        {
            if (assembler.Take(b) is { } read)
            {
                results.Add(read);
            }
        }

        return results;
    }
}
