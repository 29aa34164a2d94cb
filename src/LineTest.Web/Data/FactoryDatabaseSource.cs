using LineTest.Factory.Reporting;
using LineTest.Factory.Schema;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Npgsql;

namespace LineTest.Web.Data;

/// <summary>
/// The factory database (<c>serve --factory CONN</c>): one tile per station that has forwarded runs, with what the
/// server holds of it; yield and capability from the same loaders as <c>report --factory</c>. Read-only. A database
/// that cannot be reached shows as one unreadable tile, and the other pages say why, as for a results folder.
/// </summary>
public sealed class FactoryDatabaseSource : IResultsSource, IAsyncDisposable
{
    /// <summary>The product list (a scan of every run) is read again at most this often.</summary>
    public static readonly TimeSpan ProductsMaxAge = TimeSpan.FromSeconds(30);

    private readonly NpgsqlDataSource _dataSource;
    private readonly TimeProvider _time;
    private readonly string _name;

    // Guards the cached product list: one read at a time however many pages ask.
    private readonly SemaphoreSlim _productsGate = new(1, 1);
    private IReadOnlyList<ProductSequence>? _products;
    private DateTimeOffset _productsAt;

    private FactoryDatabaseSource(NpgsqlDataSource dataSource, TimeProvider time)
    {
        _dataSource = dataSource;
        _time = time;
        _name = FactoryConnection.Describe(dataSource);
    }

    /// <summary>Creates the source; it owns its connections until disposed.</summary>
    /// <exception cref="ArgumentException">The connection string cannot be parsed; the message says which part.</exception>
    public static FactoryDatabaseSource Create(string connectionString, TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(time);
        return new FactoryDatabaseSource(FactoryConnection.Create(connectionString), time);
    }

    /// <inheritdoc />
    public string Description => "factory database " + _name;

    /// <inheritdoc />
    public async Task<string> ReadChangeMarkAsync(CancellationToken ct)
    {
        try
        {
            return await Guard(() => FactoryPageQueries.ReadChangeMarkAsync(_dataSource, ct)).ConfigureAwait(false);
        }
        catch (ResultStoreException ex)
        {
            // The tiles then show why; the mark changes when the server comes back.
            return "unreadable: " + ex.Message;
        }
    }

    /// <inheritdoc />
    public async Task<IReadOnlyList<StationRuns>> ReadRecentAsync(DateTimeOffset fromUtc, CancellationToken ct)
    {
        try
        {
            var heads = await Guard(() => FactoryPageQueries.ReadStationsAsync(_dataSource, ct)).ConfigureAwait(false);
            var stations = new List<StationRuns>(heads.Count);
            foreach (var head in heads)
            {
                // One indexed range per station (station, ended_utc), so a tile reads its own shift and day only.
                var runs = new RunTable();
                var query = new ReportQuery { Station = head.Station, FromUtc = fromUtc };
                await Guard(() => FactoryPageQueries.LoadRunsAsync(_dataSource, query, runs, ct)).ConfigureAwait(false);
                stations.Add(new StationRuns(head.Station, _name, runs, null, null) { Factory = head });
            }

            return stations;
        }
        catch (ResultStoreException ex)
        {
            return [new StationRuns(_name, _name, new RunTable(), null, ex.Message)];
        }
    }

    /// <inheritdoc />
    public async Task<ReportData> LoadAsync(ReportQuery query, bool withReadings, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(query);
        if (withReadings)
        {
            // The rows, not the packs of runs: the page asks again every few seconds for a shift or a day while stations
            // forward, and each time the packs would first be built again for the current month.
            return await Guard(() => FactoryReportLoader.LoadAsync(_dataSource, query, ct)).ConfigureAwait(false);
        }

        // Yield needs the runs only: the report loader's run conditions in SQL, without the readings.
        var data = new ReportData();
        data.AddSource(_name);
        await Guard(() => FactoryPageQueries.LoadRunsAsync(_dataSource, query, data.Runs, ct)).ConfigureAwait(false);
        return data;
    }

    /// <inheritdoc />
    public async Task<IReadOnlyList<ProductSequence>> ReadProductsAsync(CancellationToken ct)
    {
        await _productsGate.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            var now = _time.GetUtcNow();
            if (_products is null || now - _productsAt >= ProductsMaxAge || now < _productsAt)
            {
                _products = await Guard(() => FactoryPageQueries.ReadProductsAsync(_dataSource, ct)).ConfigureAwait(false);
                _productsAt = now;
            }

            return _products;
        }
        finally
        {
            _productsGate.Release();
        }
    }

    /// <inheritdoc />
    public Task<IReadOnlyList<string>> FindSerialsAsync(string prefix, int limit, CancellationToken ct) =>
        Guard(() => FactoryPageQueries.FindSerialsAsync(_dataSource, prefix, limit, ct));

    /// <inheritdoc />
    public Task<IReadOnlyList<StoredRun>> ReadHistoryAsync(string serial, CancellationToken ct) =>
        Guard(() => FactoryPageQueries.ReadHistoryAsync(_dataSource, serial, ct));

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        await _dataSource.DisposeAsync().ConfigureAwait(false);
        _productsGate.Dispose();
    }

    private async Task Guard(Func<Task> read) => await Guard(async () =>
    {
        await read().ConfigureAwait(false);
        return true;
    }).ConfigureAwait(false);

    /// <summary>Server failures as the page's read failures, with the database named and never its password.</summary>
    private async Task<T> Guard<T>(Func<Task<T>> read)
    {
        try
        {
            return await read().ConfigureAwait(false);
        }
        catch (PostgresException ex) when (ex.SqlState == PostgresErrorCodes.UndefinedTable)
        {
            throw new ResultStoreException(ResultStoreFailure.Incompatible, $"{_name} is not a LineTest factory database (no run was ever forwarded to it)", ex);
        }
        catch (NpgsqlException ex)
        {
            throw new ResultStoreException(ResultStoreFailure.CannotOpen, $"{_name} cannot be read: {ex.Message}", ex);
        }
        catch (InvalidDataException ex)
        {
            throw new ResultStoreException(ResultStoreFailure.Incompatible, $"{_name}: {ex.Message}", ex);
        }
    }
}
