using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Web.Data;

namespace LineTest.Web.Tests.Support;

/// <summary>A results source with a change mark set by the test, counting how often the page reads it; no runs.</summary>
internal sealed class MarkCountingSource : IResultsSource
{
    public string Mark { get; set; } = "1";

    public int MarkReads { get; private set; }

    public int RecentReads { get; private set; }

    public string Description => "a counting source";

    public Task<string> ReadChangeMarkAsync(CancellationToken ct)
    {
        MarkReads++;
        return Task.FromResult(Mark);
    }

    public Task<IReadOnlyList<StationRuns>> ReadRecentAsync(DateTimeOffset fromUtc, CancellationToken ct)
    {
        RecentReads++;
        return Task.FromResult<IReadOnlyList<StationRuns>>([new StationRuns("ST-01", "here", new RunTable(), null, null)]);
    }

    public Task<ReportData> LoadAsync(ReportQuery query, bool withReadings, CancellationToken ct) => Task.FromResult(new ReportData());

    public Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(CancellationToken ct) => Task.FromResult<IReadOnlyList<ProductSequence>>([]);

    public Task<IReadOnlyList<string>> FindSerialsAsync(string prefix, int limit, CancellationToken ct) => Task.FromResult<IReadOnlyList<string>>([]);

    public Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(string serial, CancellationToken ct) => Task.FromResult<IReadOnlyList<StoredRun>>([]);
}
