using System.IO.Ports;
using System.Text;
using CsCheck;
using LineTest.Rig.Serial.Pty;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class LineReaderTests
{
    private const int MaxLength = SerialLine.DefaultMaxLineLength;

    [LinuxFact]
    [Trait("Category", "Fuzz")]
    public void Read_BuiltLineThroughAPseudoTerminal_JudgedAsTheRulesSay()
    {
        // The real port path: bytes written in random chunks on the master end, read by System.IO.Ports on the slave.
        using var pty = PseudoTerminal.Open();
        using var port = new SerialPort(pty.SlavePath, 9600, Parity.None, 8, StopBits.One) { ReadTimeout = 2000, WriteTimeout = 2000 };
        port.Open();
        try
        {
            Gen.Select(WireSegments.Segment(MaxLength, carriageReturnEndsLine: false), Gen.Int[1, 400].Array[0, 3]).Sample((segment, cuts) =>
            {
                port.DiscardInBuffer();
                foreach (var chunk in WireSegments.Chunks(segment.Bytes, cuts))
                {
                    pty.Master.Write(chunk);
                }

                var read = LineReader.Read(port, TimeProvider.System, 5000, MaxLength);

                if (segment.Kind == SegmentKind.Good)
                {
                    Assert.Equal(segment.Text, read.Line);
                }
                else
                {
                    Assert.Null(read.Line);
                    Assert.Contains(segment.Kind == SegmentKind.TooLong ? "a reply longer than 256 characters" : $"non-printable byte 0x{segment.FirstBad:X2}", read.Problem, StringComparison.Ordinal);
                }
            }, iter: 60, threads: 1, print: t => WireFuzz.Show(Encoding.Latin1.GetString(t.Item1.Bytes)));
        }
        finally
        {
            port.Close();
        }
    }

    [LinuxFact]
    public void Read_BytesWithoutLineEnd_IncompleteAfterTheTimeout()
    {
        using var pty = PseudoTerminal.Open();
        using var port = new SerialPort(pty.SlavePath, 9600, Parity.None, 8, StopBits.One) { ReadTimeout = 2000, WriteTimeout = 2000 };
        port.Open();
        try
        {
            pty.Master.Write([0x37, 0x2E, 0x32, 0x00]);

            var read = LineReader.Read(port, TimeProvider.System, 100, MaxLength);

            Assert.Equal("an incomplete reply '7.2<00>' (no line end within 100 ms)", read.Problem);
        }
        finally
        {
            port.Close();
        }
    }
}
