using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;

namespace LineTest.Reports.Loading;

/// <summary>
/// Loads report data from one or more results databases. Runs and readings are streamed from the indexed
/// columns (no stored run JSON is parsed) and kept in primitive columns, so memory grows by a few tens of
/// bytes per reading.
/// </summary>
public static class ResultsLoader
{
    /// <summary>
    /// Loads the runs and readings matching <paramref name="query"/> from <c>results.db</c> in each folder.
    /// With more than one folder the readings are put into the time order of their runs.
    /// </summary>
    /// <exception cref="ResultStoreException">A database cannot be opened or read; the message names it.</exception>
    public static async Task<ReportData> LoadAsync(IReadOnlyList<string> resultsDirectories, ReportQuery query, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(resultsDirectories);
        ArgumentNullException.ThrowIfNull(query);
        if (resultsDirectories.Count == 0)
        {
            throw new ArgumentException("At least one results folder is needed.", nameof(resultsDirectories));
        }

        var data = new ReportData();
        var filter = query.ToRunFilter();
        foreach (var directory in resultsDirectories)
        {
            var reader = SqliteResultReader.InDirectory(directory);
            data.AddSource(reader.DatabasePath);
            await LoadOneAsync(reader, filter, data, ct).ConfigureAwait(false);
        }

        if (resultsDirectories.Count > 1)
        {
            data.SortByRunTime();
        }

        return data;
    }

    private static async Task LoadOneAsync(SqliteResultReader reader, RunFilter filter, ReportData data, CancellationToken ct)
    {
        // Runs first (one row each), remembering their seq so readings can be matched by a merge walk:
        // both streams come in ascending seq order, so no lookup table is needed.
        var seqs = new List<long>();
        var firstIndex = data.Runs.Count;
        await foreach (var run in reader.ReadRunsForReportAsync(filter, ct).ConfigureAwait(false))
        {
            seqs.Add(run.Seq);
            data.Runs.Add(
                run.Serial,
                run.EndedUtc,
                run.Verdict,
                run.Station,
                run.Slot,
                run.Lot,
                run.SequenceId,
                run.SequenceRevision,
                run.FirstFailingReading,
                run.Reason);
        }

        var position = 0;
        ReadingSeries? series = null;
        await foreach (var row in reader.ReadReadingValuesAsync(filter, ct).ConfigureAwait(false))
        {
            while (position < seqs.Count && seqs[position] < row.RunSeq)
            {
                position++;
            }

            if (position == seqs.Count || seqs[position] != row.RunSeq)
            {
                // A run stored after the run query was read (the station is still writing): leave it out so
                // yield and readings describe the same runs.
                continue;
            }

            if (series is null || !string.Equals(series.Name, row.Name, StringComparison.Ordinal))
            {
                series = data.Series(row.Name, row.Unit);
            }

            series.Add(firstIndex + position, row.Value, row.Unit, row.Low, row.High);
        }
    }
}
