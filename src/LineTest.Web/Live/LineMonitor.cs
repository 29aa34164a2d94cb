using LineTest.Web.Data;

namespace LineTest.Web.Live;

/// <summary>
/// The tiles of the line page, computed once per change however many pages are open: every look first reads the
/// cheap change mark and recomputes only when it moved (or a minute passed, since shifts and idle times move on).
/// </summary>
public sealed class LineMonitor : IDisposable
{
    private static readonly TimeSpan MaxAge = TimeSpan.FromMinutes(1);
    private readonly IResultsSource _source;
    private readonly ShiftCalendar _shifts;
    private readonly TimeProvider _time;

    // Guards the cached tiles: one look at a time, so many open pages cost one read.
    private readonly SemaphoreSlim _gate = new(1, 1);
    private string? _mark;
    private DateTimeOffset _computedAt;
    private IReadOnlyList<StationTile> _tiles = [];

    /// <summary>Creates the monitor.</summary>
    public LineMonitor(IResultsSource source, ShiftCalendar shifts, TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(shifts);
        ArgumentNullException.ThrowIfNull(time);
        _source = source;
        _shifts = shifts;
        _time = time;
    }

    /// <summary>The current tiles and the change mark they were computed at.</summary>
    public async Task<(string Mark, IReadOnlyList<StationTile> Tiles)> LookAsync(CancellationToken ct)
    {
        await _gate.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            var now = _time.GetUtcNow();
            var mark = await _source.ReadChangeMarkAsync(ct).ConfigureAwait(false);
            if (mark != _mark || now - _computedAt > MaxAge)
            {
                var stations = await _source.ReadRecentAsync(LineTiles.WindowStart(now, _shifts), ct).ConfigureAwait(false);
                _tiles = [.. stations.Select(s => LineTiles.Build(s, now, _shifts))];
                _mark = mark;
                _computedAt = now;
            }

            return (_mark + "@" + _computedAt.UtcTicks, _tiles);
        }
        finally
        {
            _gate.Release();
        }
    }

    /// <inheritdoc />
    public void Dispose() => _gate.Dispose();
}
