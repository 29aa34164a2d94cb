using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Scanner;

/// <summary>
/// Turns the bytes a serial scanner sends into scans, without any I/O: CR, LF or CR LF ends a code; bytes after a line
/// end wait for the next call, so two codes that arrive together are two scans; a code must be complete within the
/// port's timeout of its first byte, measured from that byte (not from when someone started listening), so a scan
/// that arrives just as a listening slice ends is not cut in two. Every line is checked by <see cref="SerialText"/>.
/// </summary>
/// <remarks>Not thread-safe: one scan loop feeds it.</remarks>
public sealed class ScanListener
{
    /// <summary>Longest line taken from a scanner before it is refused as too long.</summary>
    public const int MaxLineLength = SerialText.MaxLength * 2;

    private readonly LineAssembler _assembler = new(MaxLineLength, carriageReturnEndsLine: true, "scan");
    private readonly Queue<ScanResult> _ready = new();
    private readonly TimeProvider _clock;
    private readonly int _timeoutMs;
    private long? _partialSince;

    /// <summary>Creates a listener.</summary>
    /// <param name="timeoutMs">How long a code may take from its first byte to its line end.</param>
    /// <param name="clock">The clock whose timestamps are passed in.</param>
    public ScanListener(int timeoutMs, TimeProvider clock)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(timeoutMs, 1);
        ArgumentNullException.ThrowIfNull(clock);
        _timeoutMs = timeoutMs;
        _clock = clock;
    }

    /// <summary>Takes bytes received at <paramref name="timestamp"/> (of the clock).</summary>
    public void Receive(ReadOnlySpan<byte> bytes, long timestamp)
    {
        foreach (var b in bytes)
        {
            _partialSince ??= timestamp;
            if (_assembler.Take(b) is { } line)
            {
                _ready.Enqueue(line.Line is { } text ? SerialText.Check(text) : ScanResult.Rejected(line.Problem!));
            }

            if (!_assembler.HasPartial)
            {
                _partialSince = null;
            }
        }
    }

    /// <summary>At <paramref name="timestamp"/>, refuses an unfinished code whose time is up.</summary>
    public void Expire(long timestamp)
    {
        if (_partialSince is { } since && _clock.GetElapsedTime(since, timestamp).TotalMilliseconds >= _timeoutMs)
        {
            _partialSince = null;
            if (_assembler.Abandon(_timeoutMs, "set the scanner to send CR or LF after each code") is { } incomplete)
            {
                _ready.Enqueue(ScanResult.Rejected(incomplete.Problem!));
            }
        }
    }

    /// <summary>
    /// How long a blocking read may wait at <paramref name="timestamp"/> before <see cref="Expire"/> has work to do:
    /// the time left for the unfinished code, or <paramref name="idleMs"/> when there is none.
    /// </summary>
    public int WaitMs(long timestamp, int idleMs)
    {
        if (_partialSince is not { } since)
        {
            return idleMs;
        }

        var left = _timeoutMs - (int)_clock.GetElapsedTime(since, timestamp).TotalMilliseconds;
        return Math.Clamp(left, 1, idleMs);
    }

    /// <summary>The next finished scan, if any.</summary>
    public bool TryTake(out ScanResult scan)
    {
        if (_ready.TryDequeue(out var next))
        {
            scan = next;
            return true;
        }

        scan = ScanResult.End;
        return false;
    }
}
