using System.Globalization;
using System.Text;
using LineTest.Factory.Forwarding;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;

namespace LineTest.Web.Data;

/// <summary>
/// Results folders of one or more stations (each with its <c>results.db</c>), read with the storage readers while
/// the stations write. A folder whose database does not exist yet shows as a station with no runs.
/// </summary>
public sealed class SqliteFolderSource : IResultsSource
{
    private readonly IReadOnlyList<string> _folders;
    private readonly IFactoryBacklog? _backlog;

    /// <summary>Creates a source over <paramref name="folders"/> (full paths).</summary>
    public SqliteFolderSource(IReadOnlyList<string> folders)
        : this(folders, null)
    {
    }

    /// <summary>
    /// Creates a source over one station's own folder, with that station's forwarding backlog on its tile (the page
    /// inside a station that forwards to the factory database).
    /// </summary>
    public SqliteFolderSource(IReadOnlyList<string> folders, IFactoryBacklog? backlog)
    {
        ArgumentNullException.ThrowIfNull(folders);
        if (folders.Count == 0)
        {
            throw new ArgumentException("At least one results folder is needed.", nameof(folders));
        }

        _folders = [.. folders.Select(Path.GetFullPath)];
        if (backlog is not null && _folders.Count != 1)
        {
            throw new ArgumentException("A station's backlog belongs to its own folder only: give one folder with it.", nameof(backlog));
        }

        _backlog = backlog;
    }

    /// <inheritdoc />
    public string Description => "results " + string.Join(", ", _folders);

    /// <inheritdoc />
    public async Task<string> ReadChangeMarkAsync(CancellationToken ct)
    {
        var mark = new StringBuilder();
        if (_backlog?.Current is { } backlog)
        {
            mark.Append(CultureInfo.InvariantCulture, $"{backlog.Count},{backlog.FailedAttempts},{backlog.LastForwardedUtc?.UtcTicks}|");
        }

        foreach (var folder in _folders)
        {
            var reader = SqliteResultReader.InDirectory(folder);
            if (!File.Exists(reader.DatabasePath))
            {
                mark.Append("-;");
                continue;
            }

            try
            {
                var live = await reader.ReadLiveStateAsync(ct).ConfigureAwait(false);
                mark.Append(CultureInfo.InvariantCulture, $"{live.LastSeq},{live.InProgress},{live.LastProgressUtc?.UtcTicks};");
            }
            catch (ResultStoreException ex)
            {
                mark.Append(ex.Failure).Append(';');
            }
        }

        return mark.ToString();
    }

    /// <inheritdoc />
    public async Task<IReadOnlyList<StationRuns>> ReadRecentAsync(DateTimeOffset fromUtc, CancellationToken ct)
    {
        var stations = new List<StationRuns>(_folders.Count);
        foreach (var folder in _folders)
        {
            var reader = SqliteResultReader.InDirectory(folder);
            var name = Path.GetFileName(Path.TrimEndingDirectorySeparator(folder));
            if (!File.Exists(reader.DatabasePath))
            {
                stations.Add(new StationRuns(name, folder, new RunTable(), null, null));
                continue;
            }

            try
            {
                var live = await reader.ReadLiveStateAsync(ct).ConfigureAwait(false);
                var runs = new RunTable();
                await FillAsync(reader, new RunFilter { FromUtc = fromUtc }, runs, ct).ConfigureAwait(false);
                if (runs.Count > 0)
                {
                    name = runs.Station(runs.Count - 1);
                }
                else if (live.LastSeq > 0)
                {
                    await foreach (var last in reader.ReadRunsAsync(new RunFilter { FirstSeq = live.LastSeq }, ct).ConfigureAwait(false))
                    {
                        name = last.Station;
                    }
                }

                stations.Add(new StationRuns(name, folder, runs, live, null) { Backlog = _backlog?.Current });
            }
            catch (ResultStoreException ex)
            {
                stations.Add(new StationRuns(name, folder, new RunTable(), null, ex.Message));
            }
        }

        return stations;
    }

    /// <inheritdoc />
    public async Task<ReportData> LoadAsync(ReportQuery query, bool withReadings, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(query);
        var existing = _folders.Where(f => File.Exists(ResultsDatabase.PathIn(f))).ToList();
        if (withReadings)
        {
            return existing.Count == 0 ? new ReportData() : await ResultsLoader.LoadAsync(existing, query, ct).ConfigureAwait(false);
        }

        // Yield needs the runs only: the same summaries the loader reads, without the readings.
        var data = new ReportData();
        var filter = query.ToRunFilter();
        foreach (var folder in existing)
        {
            var reader = SqliteResultReader.InDirectory(folder);
            data.AddSource(reader.DatabasePath);
            await FillAsync(reader, filter, data.Runs, ct).ConfigureAwait(false);
        }

        return data;
    }

    /// <inheritdoc />
    public async Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(CancellationToken ct)
    {
        var all = new Dictionary<(string, string), long>();
        foreach (var reader in Readers())
        {
            foreach (var p in await reader.ReadProductsAsync(ct).ConfigureAwait(false))
            {
                all[(p.Product, p.SequenceId)] = all.GetValueOrDefault((p.Product, p.SequenceId)) + p.Runs;
            }
        }

        return [.. all.Select(kv => new ProductSequence(kv.Key.Item1, kv.Key.Item2, kv.Value))
            .OrderBy(p => p.Product, StringComparer.Ordinal).ThenBy(p => p.SequenceId, StringComparer.Ordinal)];
    }

    /// <inheritdoc />
    public async Task<IReadOnlyList<string>> FindSerialsAsync(string prefix, int limit, CancellationToken ct)
    {
        var serials = new SortedSet<string>(StringComparer.Ordinal);
        foreach (var reader in Readers())
        {
            serials.UnionWith(await reader.FindSerialsAsync(prefix, limit, ct).ConfigureAwait(false));
        }

        return [.. serials.Take(limit)];
    }

    /// <inheritdoc />
    public async Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(string serial, CancellationToken ct)
    {
        var runs = new List<StoredRun>();
        foreach (var reader in Readers())
        {
            runs.AddRange(await reader.ReadHistoryAsync(serial, ct).ConfigureAwait(false));
        }

        // A unit retested at another station: one history in time order.
        return [.. runs.OrderBy(r => r.Run.EndedUtc).ThenBy(r => r.Seq)];
    }

    private IEnumerable<SqliteResultReader> Readers() =>
        _folders.Select(SqliteResultReader.InDirectory).Where(r => File.Exists(r.DatabasePath));

    private static async Task FillAsync(SqliteResultReader reader, RunFilter filter, RunTable runs, CancellationToken ct)
    {
        await foreach (var run in reader.ReadRunsForReportAsync(filter, ct).ConfigureAwait(false))
        {
            runs.Add(run.Serial, run.EndedUtc, run.Verdict, run.Station, run.Slot, run.Lot, run.SequenceId, run.SequenceRevision, run.FirstFailingReading, run.Reason);
        }
    }
}
