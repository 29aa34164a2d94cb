using LineTest.Web.Data;

namespace LineTest.Web.Live;

/// <summary>
/// The tiles of the line page, computed once per change however many pages are open: every look first reads the
/// cheap change mark and recomputes only when it moved (or a minute passed, since shifts and idle times move on). Looks
/// closer together than half the refresh interval share one reading, so pages reloaded often and the live events of
/// many open pages cost the results source one read per half interval at most.
/// </summary>
public sealed class LineMonitor : IDisposable
{
    private static readonly TimeSpan MaxAge = TimeSpan.FromMinutes(1);
    private readonly IResultsSource _source;
    private readonly ShiftCalendar _shifts;
    private readonly TimeProvider _time;
    private readonly TimeSpan _fresh;

    // Guards the cached tiles: one look at a time, so many open pages cost one read.
    private readonly SemaphoreSlim _gate = new(1, 1);
    private string? _mark;
    private DateTimeOffset _computedAt;
    private DateTimeOffset _lookedAt;
    private IReadOnlyList<StationTile> _tiles = [];

    /// <summary>Creates the monitor.</summary>
    public LineMonitor(IResultsSource source, ShiftCalendar shifts, TimeProvider time, Hosting.WebPageOptions options)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(shifts);
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(options);
        _source = source;
        _shifts = shifts;
        _time = time;
        _fresh = TimeSpan.FromSeconds(options.RefreshSeconds / 2);
    }

    /// <summary>The current tiles and the change mark they were computed at.</summary>
    public async Task<(string Mark, IReadOnlyList<StationTile> Tiles)> LookAsync(CancellationToken ct)
    {
        await _gate.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            var now = _time.GetUtcNow();
            if (_mark is not null && now >= _lookedAt && now - _lookedAt < _fresh)
            {
                return (_mark + "@" + _computedAt.UtcTicks, _tiles);
            }

            _lookedAt = now;
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
