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
    /// <summary>Below this many runs per range the readings are read on one connection: a range costs a connection.</summary>
    internal const long MinRunsPerPart = 20_000;

    /// <summary>
    /// Loads the runs and readings matching <paramref name="query"/> from <c>results.db</c> in each folder.
    /// With more than one folder the readings are put into the time order of their runs.
    /// </summary>
    /// <exception cref="ResultStoreException">A database cannot be opened or read; the message names it.</exception>
    public static Task<ReportData> LoadAsync(IReadOnlyList<string> resultsDirectories, ReportQuery query, CancellationToken ct = default) =>
        LoadAsync(resultsDirectories, query, parts: null, skipDamagedRuns: false, ct);

    /// <summary>
    /// As <see cref="LoadAsync(IReadOnlyList{string}, ReportQuery, CancellationToken)"/>; with
    /// <paramref name="skipDamagedRuns"/> (<c>report --skip-bad-rows</c>) a damaged run (a date, verdict or number that
    /// does not parse, an empty reading name, limits the wrong way round, no serial) is left out with all its readings,
    /// and named with its seq and reason in <see cref="ReportData.SkippedRows"/>, instead of stopping the load.
    /// </summary>
    /// <exception cref="ResultStoreException">A database cannot be opened or read, or (without skipping) holds a damaged run.</exception>
    public static Task<ReportData> LoadAsync(IReadOnlyList<string> resultsDirectories, ReportQuery query, bool skipDamagedRuns, CancellationToken ct = default) =>
        LoadAsync(resultsDirectories, query, parts: null, skipDamagedRuns, ct);

    /// <summary>
    /// As <see cref="LoadAsync(IReadOnlyList{string}, ReportQuery, CancellationToken)"/>, reading each database's
    /// readings in <paramref name="parts"/> seq ranges at once (null: one per core for a large database, else one).
    /// The result does not depend on the number of ranges.
    /// </summary>
    public static Task<ReportData> LoadAsync(IReadOnlyList<string> resultsDirectories, ReportQuery query, int? parts, CancellationToken ct = default) =>
        LoadAsync(resultsDirectories, query, parts, skipDamagedRuns: false, ct);

    private static async Task<ReportData> LoadAsync(IReadOnlyList<string> resultsDirectories, ReportQuery query, int? parts, bool skipDamagedRuns, CancellationToken ct)
    {
        if (parts is int given)
        {
            ArgumentOutOfRangeException.ThrowIfLessThan(given, 1);
        }

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
            var damaged = skipDamagedRuns ? new DamagedRuns() : null;
            await LoadOneAsync(reader, filter, data, parts, query.GroupBy == ReportGrouping.Operator, damaged, ct).ConfigureAwait(false);
            foreach (var (seq, reason) in damaged?.InSeqOrder() ?? [])
            {
                data.AddSkippedRow(resultsDirectories.Count == 1 ? $"seq {seq}: {reason}" : $"{reader.DatabasePath} seq {seq}: {reason}");
            }
        }

        if (resultsDirectories.Count > 1)
        {
            data.SortByRunTime();
        }

        return data;
    }

    private static async Task LoadOneAsync(SqliteResultReader reader, RunFilter filter, ReportData data, int? parts, bool operators, DamagedRuns? damaged, CancellationToken ct)
    {
        // The runs that match now; pinning both scans to this range keeps runs and readings describing the same runs
        // while the station goes on writing (runs are only appended).
        if (await reader.ReadSeqRangeAsync(filter, ct).ConfigureAwait(false) is not { } range)
        {
            return;
        }

        // Runs on one connection and readings cut into seq ranges on others, all at once: a large database is
        // read on every core. Each range keeps its rows in a compact buffer until the runs are known.
        // When damaged runs are skipped, a run is known to be sound only once its readings are read too: the runs are
        // held until then, and those with a damaged reading are left out.
        var pinned = filter with { FirstSeq = range.First, LastSeq = range.Last };
        var held = damaged is null ? null : new List<RunSummary>();
        var index = new RunIndex(data.Runs);
        var runsTask = Task.Run(() => ReadRunsAsync(reader, pinned, held is null ? index.Add : held.Add, damaged, ct), ct);
        var rangeTasks = range.Split(parts ?? (range.Last - range.First + 1 >= MinRunsPerPart * 2 ? Environment.ProcessorCount : 1))
            .Select(part => Task.Run(() => ReadingBuffer.FillAsync(reader, pinned with { FirstSeq = part.First, LastSeq = part.Last }, damaged, ct), ct))
            .ToList();
        await runsTask.ConfigureAwait(false);
        var buffers = await Task.WhenAll(rangeTasks).ConfigureAwait(false);
        foreach (var run in held?.Where(r => !damaged!.Contains(r.Seq)) ?? [])
        {
            index.Add(run);
        }

        var (firstIndex, seqs, firstOfSequence) = index.Result;

        foreach (var (sequence, product) in await reader.ReadProductsAsync(firstOfSequence, ct).ConfigureAwait(false))
        {
            data.AddProduct(sequence, product);
        }

        if (operators)
        {
            // Same filter, same seq range, same order: the n-th operator belongs to the n-th run.
            var n = 0;
            await foreach (var (seq, name) in reader.ReadOperatorsAsync(pinned, ct).ConfigureAwait(false))
            {
                if (n < seqs.Count && seqs[n] == seq)
                {
                    data.Runs.SetOperator(firstIndex + n, name);
                    n++;
                }
            }
        }

        // Ranges are in seq order and each buffer is in seq order, so one forward walk over the runs' seqs finds each
        // reading's run.
        var position = 0;
        foreach (var buffer in buffers)
        {
            position = buffer.AddTo(data, seqs, firstIndex, position);
        }
    }

    /// <summary>Reads the runs matching <paramref name="filter"/>, in seq order, into <paramref name="add"/>.</summary>
    private static async Task ReadRunsAsync(SqliteResultReader reader, RunFilter filter, Action<RunSummary> add, DamagedRuns? damaged, CancellationToken ct)
    {
        await foreach (var run in reader.ReadRunsForReportAsync(filter, damaged, ct).ConfigureAwait(false))
        {
            add(run);
        }
    }

    /// <summary>
    /// Adds runs to the table, keeping their seqs and the first run of each sequence; the first run's index in the table
    /// is the table's count when the index is made.
    /// </summary>
    private sealed class RunIndex(RunTable runs)
    {
        private readonly int _firstIndex = runs.Count;
        private readonly List<long> _seqs = [];
        private readonly HashSet<string> _sequences = new(StringComparer.Ordinal);
        private readonly List<long> _firstOfSequence = [];
        private string? _lastSequence;

        public (int FirstIndex, List<long> Seqs, List<long> FirstOfSequence) Result => (_firstIndex, _seqs, _firstOfSequence);

        public void Add(RunSummary run)
        {
            _seqs.Add(run.Seq);
            if (!ReferenceEquals(run.SequenceId, _lastSequence) && _sequences.Add(run.SequenceId))
            {
                _firstOfSequence.Add(run.Seq);
            }

            _lastSequence = run.SequenceId;
            runs.Add(
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
    }
}
