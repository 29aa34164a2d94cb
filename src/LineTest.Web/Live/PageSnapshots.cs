using LineTest.Web.Data;

namespace LineTest.Web.Live;

/// <summary>
/// Pages that read many runs (yield and its Pareto chart), kept per URL: a page asked for again within
/// <see cref="MaxAge"/> is served as made, and after that made again only when the results changed (the source's change
/// mark moved). So a yield page left open and reloaded, or opened by several people, costs one reading per
/// <see cref="MaxAge"/> while a station writes, and none while it is idle. A page made on an earlier UTC day is always
/// made again: without chosen dates a page shows the last days up to today, so its window moves at midnight.
/// </summary>
public sealed class PageSnapshots : IDisposable
{
    /// <summary>How long a page is served as made, even while runs are being stored.</summary>
    public static readonly TimeSpan MaxAge = TimeSpan.FromSeconds(10);

    /// <summary>Pages kept at most; the oldest goes first.</summary>
    public const int Capacity = 32;

    private readonly IResultsSource _source;
    private readonly TimeProvider _time;

    // Guards the pages: one page made at a time, so a burst of the same request costs one reading.
    private readonly SemaphoreSlim _gate = new(1, 1);
    private readonly Dictionary<string, (DateTimeOffset At, DateOnly Day, string Mark, object Page)> _pages = new(StringComparer.Ordinal);

    /// <summary>Creates the cache over <paramref name="source"/>.</summary>
    public PageSnapshots(IResultsSource source, TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(time);
        _source = source;
        _time = time;
    }

    /// <summary>The page for <paramref name="key"/> (path and query), from the cache or made by <paramref name="make"/>.</summary>
    public async Task<T> GetAsync<T>(string key, Func<Task<T>> make, CancellationToken ct)
        where T : class
    {
        ArgumentNullException.ThrowIfNull(key);
        ArgumentNullException.ThrowIfNull(make);
        await _gate.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            var now = _time.GetUtcNow();
            var today = DateOnly.FromDateTime(now.UtcDateTime);
            var found = _pages.TryGetValue(key, out var kept) && kept.Page is T && kept.Day == today;
            if (found && now >= kept.At && now - kept.At < MaxAge)
            {
                return (T)kept.Page;
            }

            var mark = await _source.ReadChangeMarkAsync(ct).ConfigureAwait(false);
            if (found && kept.Mark == mark)
            {
                _pages[key] = (now, today, mark, kept.Page);
                return (T)kept.Page;
            }

            var page = await make().ConfigureAwait(false);
            if (!_pages.ContainsKey(key) && _pages.Count >= Capacity)
            {
                _pages.Remove(_pages.MinBy(p => p.Value.At).Key);
            }

            _pages[key] = (now, today, mark, page);
            return page;
        }
        finally
        {
            _gate.Release();
        }
    }

    /// <inheritdoc />
    public void Dispose() => _gate.Dispose();
}
