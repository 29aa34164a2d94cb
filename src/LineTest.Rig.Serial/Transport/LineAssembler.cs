using System.Globalization;
using System.Text;

namespace LineTest.Rig.Serial.Transport;

/// <summary>
/// Splits received bytes into lines and judges each, without any I/O, so that every way bytes can arrive (split
/// anywhere, noise, no line end) can be tested directly. Only printable ASCII (0x20–0x7E, and TAB) makes a line, and a
/// line may not exceed a maximum length. After an over-long line the rest of it, up to the next line end, is dropped,
/// so that its tail is never taken for a line of its own.
/// </summary>
/// <remarks>Not thread-safe: one reader feeds it.</remarks>
internal sealed class LineAssembler
{
    private readonly List<byte> _line = new(64);
    private readonly int _maxLength;
    private readonly bool _carriageReturnEndsLine;
    private readonly string _noun;
    private bool _discarding;
    private bool _afterCarriageReturn;

    /// <param name="maxLength">Longest line accepted, characters.</param>
    /// <param name="carriageReturnEndsLine">
    /// False (instruments): LF ends a line and a CR just before it is dropped. True (scanners, which are set to send CR,
    /// LF or both): CR, LF and CR LF each end one line, and empty lines are skipped.
    /// </param>
    /// <param name="noun">What a line is called in problems: <c>reply</c> or <c>scan</c>.</param>
    public LineAssembler(int maxLength, bool carriageReturnEndsLine, string noun)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(maxLength, 1);
        ArgumentException.ThrowIfNullOrWhiteSpace(noun);
        _maxLength = maxLength;
        _carriageReturnEndsLine = carriageReturnEndsLine;
        _noun = noun;
    }

    /// <summary>True when bytes of an unfinished line are held (or the tail of an over-long one is being dropped).</summary>
    public bool HasPartial => _line.Count > 0 || _discarding;

    /// <summary>Takes one byte; returns the judged line when the byte ends one or makes it too long, else null.</summary>
    public LineRead? Take(byte b)
    {
        var afterCarriageReturn = _afterCarriageReturn;
        _afterCarriageReturn = b == (byte)'\r';
        var ends = b == (byte)'\n' || (_carriageReturnEndsLine && b == (byte)'\r');
        if (ends)
        {
            if (_discarding)
            {
                _discarding = false;
                _line.Clear();
                return null;
            }

            if (_carriageReturnEndsLine)
            {
                // The LF of a CR LF pair ends nothing new; nor does an empty line.
                if ((b == (byte)'\n' && afterCarriageReturn) || _line.Count == 0)
                {
                    return null;
                }
            }
            else if (_line.Count > 0 && _line[^1] == (byte)'\r')
            {
                _line.RemoveAt(_line.Count - 1);
            }

            var judged = Judge();
            _line.Clear();
            return judged;
        }

        if (_discarding)
        {
            return null;
        }

        _line.Add(b);

        // Without CR as a line end, a CR may still come before the LF: allow one byte more until then.
        if (_line.Count > _maxLength + (_carriageReturnEndsLine ? 0 : 1))
        {
            var tooLong = TooLong();
            _line.Clear();
            _discarding = true;
            return tooLong;
        }

        return null;
    }

    /// <summary>
    /// Gives up on the unfinished line: returns it as an incomplete line (no line end within <paramref name="timeoutMs"/>),
    /// or null when only the tail of an over-long line was being dropped (that line was reported already).
    /// </summary>
    public LineRead? Abandon(int timeoutMs, string? advice = null)
    {
        var wasDiscarding = _discarding;
        _discarding = false;
        _afterCarriageReturn = false;
        if (_line.Count == 0 || wasDiscarding)
        {
            _line.Clear();
            return null;
        }

        var shown = Show(_line);
        _line.Clear();
        return new LineRead(null, string.Create(CultureInfo.InvariantCulture,
            $"an incomplete {_noun} '{shown}' (no line end within {timeoutMs} ms{(advice is null ? string.Empty : ": " + advice)})"));
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

    /// <summary>True for the bytes a line may hold: printable ASCII and TAB.</summary>
    public static bool IsPrintable(byte b) => b is >= 0x20 and <= 0x7E or (byte)'\t';

    private LineRead TooLong()
        => new(null, string.Create(CultureInfo.InvariantCulture, $"a {_noun} longer than {_maxLength} characters ('{Show(_line.Take(40))}…')"));

    private LineRead Judge()
    {
        if (_line.Count > _maxLength)
        {
            return TooLong();
        }

        var bad = _line.FindIndex(b => !IsPrintable(b));
        if (bad >= 0)
        {
            return new LineRead(null, string.Create(CultureInfo.InvariantCulture,
                $"a {_noun} with the non-printable byte 0x{_line[bad]:X2} at position {bad + 1} ('{Show(_line)}')"));
        }

        return new LineRead(Encoding.ASCII.GetString(_line.ToArray()), null);
    }
}
