using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Web.Live;

namespace LineTest.Web.Data;

/// <summary>
/// Where the page reads stored runs: results folders of stations now, the factory database later. Read-only;
/// every statistic is computed from what this returns by the report builder, so the page and <c>report</c> agree.
/// </summary>
public interface IResultsSource
{
    /// <summary>What is read, in words, for the page footer and the log (e.g. the results folders).</summary>
    string Description { get; }

    /// <summary>A text that changes whenever a run is stored or a batch starts or ends; cheap enough to poll.</summary>
    Task<string> ReadChangeMarkAsync(CancellationToken ct);

    /// <summary>The runs that ended at or after <paramref name="fromUtc"/>, one table per station, with its live state.</summary>
    Task<IReadOnlyList<StationRuns>> ReadRecentAsync(DateTimeOffset fromUtc, CancellationToken ct);

    /// <summary>Runs (and, when <paramref name="withReadings"/>, readings) matching <paramref name="query"/>, as <c>report</c> loads them.</summary>
    Task<ReportData> LoadAsync(ReportQuery query, bool withReadings, CancellationToken ct);

    /// <summary>Products with the sequence ids that tested them.</summary>
    Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(CancellationToken ct);

    /// <summary>Serials that start with <paramref name="prefix"/>, in order, at most <paramref name="limit"/>.</summary>
    Task<IReadOnlyList<string>> FindSerialsAsync(string prefix, int limit, CancellationToken ct);

    /// <summary>Every run of <paramref name="serial"/>, oldest first, with its record hash.</summary>
    Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(string serial, CancellationToken ct);
}
