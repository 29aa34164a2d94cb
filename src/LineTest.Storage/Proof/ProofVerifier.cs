using System.Globalization;
using LineTest.Storage.Chain;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Proof;

/// <summary>
/// Proves that nothing is missing from a results folder: the hash chain (<see cref="ChainVerifier"/>), then the database
/// against <c>results.head</c> (last run, run count, release list, journal), against its own seq counter
/// (<c>sqlite_sequence</c>), against heads the station set aside, against an anchor written down elsewhere, and the runs
/// stored from journal entries nothing proved. A lost WAL, a deleted tail or a restored old copy all show as
/// <c>runs missing after seq N</c>.
/// </summary>
public static class ProofVerifier
{
    /// <summary>Checks the results folder <paramref name="resultsFolder"/>.</summary>
    /// <param name="resultsFolder">The folder holding results.db and results.head.</param>
    /// <param name="expected">An anchor <c>SEQ:HASH</c> written down earlier, or null.</param>
    /// <param name="ct">Cancellation.</param>
    /// <exception cref="ResultStoreException">The database cannot be opened or read at all.</exception>
    public static async Task<ProofReport> VerifyAsync(string resultsFolder, (long Seq, string Sha256)? expected = null, CancellationToken ct = default)
    {
        var databasePath = ResultsDatabase.PathIn(resultsFolder);
        var chain = await ChainVerifier.VerifyAsync(databasePath, ct).ConfigureAwait(false);
        var reader = new SqliteResultReader(databasePath);
        await using var connection = await reader.OpenAsync(ct).ConfigureAwait(false);
        try
        {
            // One read transaction: every figure below comes from the same moment, even while a station writes. The head
            // is read before and after it; a head replaced meanwhile (a station writing) means: take the moment again.
            SqliteTransaction transaction;
            HeadState database;
            long issued;
            HeadRead head;
            for (var attempt = 0; ; attempt++)
            {
                var before = HeadText(resultsFolder);
                transaction = connection.BeginTransaction(deferred: true);
                database = ProofReader.Read(connection, transaction, runs: null);
                issued = ProofReader.IssuedSeq(connection, transaction);
                head = HeadFile.Read(resultsFolder);
                if (before == HeadText(resultsFolder) || attempt == 20)
                {
                    break;
                }

                transaction.Dispose();
            }

            using var snapshot = transaction;
            var problems = new List<ProofProblem>();
            var notes = new List<string>();
            var check = new Check(connection, transaction, database, problems);
            if (issued > database.Seq)
            {
                problems.Add(new(ProofProblemKind.RunsMissing, string.Create(CultureInfo.InvariantCulture,
                    $"runs missing after seq {database.Seq}: the database gave out seq numbers up to {issued} (sqlite_sequence), but its last run is seq {database.Seq}; runs were deleted from the end")));
            }

            check.AgainstHead(head, notes);
            foreach (var aside in SetAside(resultsFolder))
            {
                check.SetAsideHead(aside);
            }

            if (expected is { } anchor)
            {
                check.Anchor(anchor.Seq, anchor.Sha256, "the expected head (--expect-head)");
                if (check.RunHash(anchor.Seq) == anchor.Sha256)
                {
                    notes.Add(string.Create(CultureInfo.InvariantCulture, $"the expected head {anchor.Seq}:{anchor.Sha256} is in the database"));
                }
            }

            check.JournalRuns();
            return new ProofReport(chain, database, issued, head, problems, notes);
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The results could not be checked against their head", databasePath);
        }
    }

    private static string? HeadText(string resultsFolder)
    {
        try
        {
            return File.ReadAllText(HeadFile.PathIn(resultsFolder));
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }

    private static IEnumerable<string> SetAside(string resultsFolder)
    {
        var folder = Path.GetFullPath(resultsFolder);
        return Directory.Exists(folder)
            ? Directory.EnumerateFiles(folder, HeadFile.MismatchPrefix + "*").Order(StringComparer.Ordinal)
            : [];
    }

    /// <summary>The comparisons, over one read transaction.</summary>
    private sealed class Check(SqliteConnection connection, SqliteTransaction transaction, HeadState database, List<ProofProblem> problems)
    {
        private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

        public void AgainstHead(HeadRead read, List<string> notes)
        {
            if (!read.Exists)
            {
                if (database.Seq != 0 || database.Releases != 0 || database.Journal.Count != 0)
                {
                    problems.Add(new(ProofProblemKind.HeadMissing,
                        $"{HeadFile.FileName} is missing beside a database that holds data: nothing proves that no run is missing from the end "
                        + "(it was deleted, or the database was last written by a LineTest without a head file; the next station start writes a new one)"));
                }

                return;
            }

            if (read.Head is not { } head)
            {
                problems.Add(new(ProofProblemKind.HeadUnreadable, read.Problem ?? $"{HeadFile.FileName} cannot be read"));
                return;
            }

            if (head.Current.SameContent(database))
            {
                CountAgainst(head.Current);
                return;
            }

            if (head.Previous is { } previous && previous.SameContent(database))
            {
                notes.Add($"the last write (head {head.Current.Anchor}) was not committed when checked: it was in progress, or the station stopped "
                    + "between writing the head and committing (a run it was storing is then still in the journal and is stored as interrupted at the next start)");
                CountAgainst(previous);
                return;
            }

            Compare(head.Current, "the head");
        }

        public void SetAsideHead(string path)
        {
            var read = HeadFile.ReadFile(path);
            var name = Path.GetFileName(path);
            var what = read.Head is { } head
                ? $"its last run was seq {head.Current.Anchor}{(RunHash(head.Current.Seq) == head.Current.Sha256 ? ", which is still stored" : ", which is no longer stored")}"
                : "it cannot be read";
            problems.Add(new(ProofProblemKind.HeadSetAside,
                $"{name}: at a write the station found the database no longer matched this head and set it aside ({what}); "
                + "the database was changed, rolled back or restored outside LineTest. Investigate, then move the file out of the results folder"));
            if (read.Head is { } kept)
            {
                Anchor(kept.Current.Seq, kept.Current.Sha256, name);
            }
        }

        public void Anchor(long seq, string sha, string what)
        {
            if (seq == 0)
            {
                return;
            }

            var stored = RunHash(seq);
            if (stored == sha)
            {
                return;
            }

            problems.Add(stored is null
                ? new(ProofProblemKind.RunsMissing, string.Create(Inv,
                    $"runs missing after seq {LastSeqBefore(seq)}: {what} says run seq {seq} ({sha}) was stored, and it is not in the database"))
                : new(ProofProblemKind.RunReplaced, string.Create(Inv,
                    $"run seq {seq} is not the run {what} proves ({sha}, the database has {stored}): the database was rolled back or replaced and written since; runs missing after seq {LastSeqBefore(seq)} or earlier")));
        }

        public void JournalRuns()
        {
            using var command = connection.CreateCommand();
            command.Transaction = transaction;
            command.CommandText = "SELECT seq, id, serial, reason FROM runs WHERE reason IN ($unproven, $unreadable) ORDER BY seq;";
            command.Parameters.AddWithValue("$unproven", SqliteResultStore.JournalUnprovenReason);
            command.Parameters.AddWithValue("$unreadable", SqliteResultStore.JournalUnreadableReason);
            using var reader = command.ExecuteReader();
            while (reader.Read())
            {
                var why = reader.GetString(3) == SqliteResultStore.JournalUnprovenReason
                    ? "from a journal entry the head did not prove the station wrote (added or changed outside LineTest)"
                    : $"from a journal entry that was not a run (its text is kept in reading {SqliteResultStore.JournalRawReading})";
                problems.Add(new(ProofProblemKind.JournalRunUnproven, string.Create(Inv,
                    $"run seq {reader.GetInt64(0)} (id {reader.GetString(1)}, serial {reader.GetString(2)}) was stored at a start {why}")));
            }
        }

        public string? RunHash(long seq)
        {
            using var command = connection.CreateCommand();
            command.Transaction = transaction;
            command.CommandText = "SELECT record_sha256 FROM runs WHERE seq = $seq;";
            command.Parameters.AddWithValue("$seq", seq);
            return command.ExecuteScalar() as string;
        }

        private void CountAgainst(HeadState head)
        {
            if (head.Runs != database.Runs)
            {
                problems.Add(new(ProofProblemKind.RunCountDiffers, string.Create(Inv,
                    $"the database holds {database.Runs} runs, its head says {head.Runs}: runs were deleted or added outside LineTest")));
            }
        }

        private void Compare(HeadState head, string what)
        {
            if (head.Seq > database.Seq || RunHash(head.Seq) != head.Sha256)
            {
                Anchor(head.Seq, head.Sha256, what);
            }
            else if (database.Seq > head.Seq)
            {
                problems.Add(new(ProofProblemKind.NotCoveredByHead, string.Create(Inv,
                    $"runs seq {head.Seq + 1} to {database.Seq} are not covered by {what} (it ends at seq {head.Anchor}): they were stored outside LineTest")));
            }
            else
            {
                CountAgainst(head);
            }

            if (head.Releases != database.Releases || head.ReleasesDigest != database.ReleasesDigest)
            {
                problems.Add(new(ProofProblemKind.ReleasesChanged, string.Create(Inv,
                    $"the release list differs from the one the station last wrote ({head.Releases} releases and revocations, the database has {database.Releases}): a release or revocation was added, changed or removed outside LineTest")));
            }

            foreach (var row in database.Journal.Where(r => !head.Journal.Contains(r)))
            {
                problems.Add(new(ProofProblemKind.JournalChanged,
                    $"journal entry {row.Id} (a run in progress) was not written by the station: it was added or changed outside LineTest, and would be stored as a run at the next start"));
            }

            foreach (var row in head.Journal.Where(r => database.Journal.All(d => d.Id != r.Id)))
            {
                problems.Add(new(ProofProblemKind.JournalChanged,
                    $"journal entry {row.Id} (a run in progress) is missing: it was removed outside LineTest"));
            }
        }

        private long LastSeqBefore(long seq)
        {
            using var command = connection.CreateCommand();
            command.Transaction = transaction;
            command.CommandText = "SELECT coalesce(max(seq), 0) FROM runs WHERE seq < $seq;";
            command.Parameters.AddWithValue("$seq", seq);
            return (long)command.ExecuteScalar()!;
        }
    }
}
