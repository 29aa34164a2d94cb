using System.Collections.Concurrent;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Web.Data;

namespace LineTest.Web.Tests.Support;

/// <summary>A results source that passes every call to another and records the queries the page loads with.</summary>
internal sealed class QueryRecordingSource(IResultsSource inner) : IResultsSource
{
    public ConcurrentQueue<(ReportQuery Query, bool WithReadings)> Loads { get; } = new();

    public IResultsSource Inner => inner;

    public string Description => inner.Description;

    public Task<string> ReadChangeMarkAsync(CancellationToken ct) => inner.ReadChangeMarkAsync(ct);

    public Task<IReadOnlyList<StationRuns>> ReadRecentAsync(DateTimeOffset fromUtc, CancellationToken ct) => inner.ReadRecentAsync(fromUtc, ct);

    public Task<ReportData> LoadAsync(ReportQuery query, bool withReadings, CancellationToken ct)
    {
        Loads.Enqueue((query, withReadings));
        return inner.LoadAsync(query, withReadings, ct);
    }

    public Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(CancellationToken ct) => inner.ReadProductsAsync(ct);

    public Task<IReadOnlyList<string>> FindSerialsAsync(string prefix, int limit, CancellationToken ct) => inner.FindSerialsAsync(prefix, limit, ct);

    public Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(string serial, CancellationToken ct) => inner.ReadHistoryAsync(serial, ct);
}
