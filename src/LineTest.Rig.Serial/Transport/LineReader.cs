using System.Globalization;
using System.IO.Ports;
using System.Text;

namespace LineTest.Rig.Serial.Transport;

/// <summary>
/// Reads one line (ended by LF; a CR before it is dropped) from a serial port by a wall-clock deadline, and judges
/// its framing: only printable ASCII (0x20–0x7E, and TAB) is allowed, and a line may not exceed a maximum length.
/// </summary>
internal static class LineReader
{
    public static LineRead Read(SerialPort port, TimeProvider clock, int timeoutMs, int maxLength)
    {
        var started = clock.GetTimestamp();
        var received = new List<byte>(64);
        var chunk = new byte[256];
        while (true)
        {
            var remaining = timeoutMs - (int)clock.GetElapsedTime(started).TotalMilliseconds;
            if (remaining <= 0)
            {
                return received.Count == 0
                    ? new LineRead(null, null)
                    : new LineRead(null, $"an incomplete reply '{Show(received)}' (no line end within {timeoutMs} ms)");
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
                var b = chunk[i];
                if (b == (byte)'\n')
                {
                    if (received.Count > 0 && received[^1] == (byte)'\r')
                    {
                        received.RemoveAt(received.Count - 1);
                    }

                    return Judge(received, maxLength);
                }

                received.Add(b);
                if (received.Count > maxLength + 1)
                {
                    return new LineRead(null, string.Create(CultureInfo.InvariantCulture, $"a reply longer than {maxLength} characters ('{Show(received.Take(40))}…')"));
                }
            }
        }
    }

    /// <summary>The bytes in a form fit for a message: printable ASCII as is, anything else as <c>&lt;XX&gt;</c>.</summary>
    public static string Show(IEnumerable<byte> bytes)
    {
        var text = new StringBuilder();
        foreach (var b in bytes)
        {
            if (IsPrintable(b))
            {
                text.Append((char)b);
            }
            else
            {
                text.Append(CultureInfo.InvariantCulture, $"<{b:X2}>");
            }
        }

        return text.ToString();
    }

    private static bool IsPrintable(byte b) => b is >= 0x20 and <= 0x7E or (byte)'\t';

    private static LineRead Judge(List<byte> line, int maxLength)
    {
        if (line.Count > maxLength)
        {
            return new LineRead(null, string.Create(CultureInfo.InvariantCulture, $"a reply longer than {maxLength} characters ('{Show(line.Take(40))}…')"));
        }

        var bad = line.FindIndex(b => !IsPrintable(b));
        if (bad >= 0)
        {
            return new LineRead(null, string.Create(CultureInfo.InvariantCulture, $"a reply with the non-printable byte 0x{line[bad]:X2} at position {bad + 1} ('{Show(line)}')"));
        }

        return new LineRead(Encoding.ASCII.GetString(line.ToArray()), null);
    }
}
