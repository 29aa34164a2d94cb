using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Web.Data;

namespace LineTest.Station.Demo;

/// <summary>
/// The page benchmark's source: one results folder at a time, switched between shifts, so that one page (started once,
/// as a station starts it) serves every shift while each shift writes a fresh folder and does the same work.
/// </summary>
internal sealed class SwitchableFolderSource : IResultsSource
{
    // Replaced between shifts only, while no request is being answered; read by request threads.
    private volatile SqliteFolderSource _current;

    public SwitchableFolderSource(string folder) => _current = new SqliteFolderSource([folder]);

    public string Description => _current.Description;

    public void SwitchTo(string folder) => _current = new SqliteFolderSource([folder]);

    public Task<string> ReadChangeMarkAsync(CancellationToken ct) => _current.ReadChangeMarkAsync(ct);

    public Task<IReadOnlyList<StationRuns>> ReadRecentAsync(DateTimeOffset fromUtc, CancellationToken ct) => _current.ReadRecentAsync(fromUtc, ct);

    public Task<ReportData> LoadAsync(ReportQuery query, bool withReadings, CancellationToken ct) => _current.LoadAsync(query, withReadings, ct);

    public Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(CancellationToken ct) => _current.ReadProductsAsync(ct);

    public Task<IReadOnlyList<string>> FindSerialsAsync(string prefix, int limit, CancellationToken ct) => _current.FindSerialsAsync(prefix, limit, ct);

    public Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(string serial, CancellationToken ct) => _current.ReadHistoryAsync(serial, ct);
}
