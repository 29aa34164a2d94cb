using System.IO.Ports;

namespace LineTest.Rig.Serial.Transport;

/// <summary>
/// Reads one reply line (ended by LF; a CR before it is dropped) from a serial port by a wall-clock deadline; the
/// bytes are judged by a <see cref="LineAssembler"/>: only printable ASCII (0x20–0x7E, and TAB), at most a maximum length.
/// </summary>
internal static class LineReader
{
    public static LineRead Read(SerialPort port, TimeProvider clock, int timeoutMs, int maxLength)
    {
        var started = clock.GetTimestamp();
        var assembler = new LineAssembler(maxLength, carriageReturnEndsLine: false, "reply");
        var chunk = new byte[256];
        while (true)
        {
            var remaining = timeoutMs - (int)clock.GetElapsedTime(started).TotalMilliseconds;
            if (remaining <= 0)
            {
                return assembler.Abandon(timeoutMs) ?? new LineRead(null, null);
            }

            port.ReadTimeout = remaining;
            int count;
            try
            {
                count = port.Read(chunk, 0, chunk.Length);
            }
            catch (TimeoutException)
            {
                continue;
            }

            for (var i = 0; i < count; i++)
            {
                if (assembler.Take(chunk[i]) is { } line)
                {
                    // Anything after the line end is stale: the next command discards unread input first.
                    return line;
                }
            }
        }
    }
}
