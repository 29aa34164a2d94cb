using LineTest.Storage.Proof;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The proof that nothing is missing: every write (a run, journal entries, a release, a revocation, a recovery step) runs
/// in one transaction that, before it commits, replaces <c>results.head</c> with the state after the write and the state
/// before it. After a stop at any moment the database therefore equals one of the two.
/// </summary>
public sealed partial class SqliteResultStore
{
    private readonly string _folder;

    // The head as last written or read by this store. Only touched while holding _writeLock, inside a write transaction.
    private ResultsHead? _head;

    /// <summary>The head file as it was when the store was opened (before any write of this store).</summary>
    public HeadRead OpenedHead { get; }

    /// <summary>The database state after the last write of this store, or as read at open; null before the first write of a folder.</summary>
    public HeadState? Head => _head?.Current;

    /// <summary>
    /// Heads set aside by this store because the database no longer matched them (edited, rolled back or restored
    /// outside LineTest); each is kept as <c>results.head.mismatch-N</c> for <c>linetest verify</c> to report.
    /// </summary>
    public IReadOnlyList<string> HeadsSetAside => _setAside;

    private readonly List<string> _setAside = [];

    /// <summary>
    /// Test seam: called with the name of each point of a write (<c>insert-run</c>, <c>insert-readings</c>,
    /// <c>delete-journal</c>, <c>head-written</c>, <c>committed</c>, and the recovery's own points) so a test can throw there,
    /// as a crash would stop the process between two statements.
    /// </summary>
    internal Action<string>? FaultPoint { get; set; }

    private void Fault(string point) => FaultPoint?.Invoke(point);

    /// <summary>
    /// Runs <paramref name="change"/> in one immediate transaction, writes the head (after and before) and commits.
    /// </summary>
    /// <param name="change">The change; returns how many runs it stored.</param>
    private void InWrite(Func<SqliteTransaction, long> change)
    {
        using var transaction = _connection.BeginTransaction(deferred: false);
        var before = BaseState(transaction);
        var runsAdded = change(transaction);
        var after = ProofReader.Read(_connection, transaction, runs: 0) with { Runs = before.Runs + runsAdded };
        var head = new ResultsHead(after, before);
        HeadFile.Write(_folder, head);
        Fault("head-written");
        transaction.Commit();
        _head = head;
        Fault("committed");
    }

    /// <summary>
    /// The state the database is in before this write, checked against the head: it must be the head's current state, or
    /// its previous one when the last write did not commit. Anything else was changed outside LineTest: the head is set
    /// aside as evidence and the proof starts again from what the database holds.
    /// </summary>
    private HeadState BaseState(SqliteTransaction transaction)
    {
        // Read again inside the transaction: another store of this process may have written since (the transaction's
        // write lock keeps every other writer out until this one commits).
        var file = HeadFile.Read(_folder);
        _head = file.Head;
        var state = ProofReader.Read(_connection, transaction, runs: 0);
        if (file.Exists && file.Head is null && HeadFile.SetAside(_folder) is { } unreadable)
        {
            _setAside.Add(unreadable);
        }

        if (_head is { } head)
        {
            if (head.Current.SameContent(state))
            {
                return state with { Runs = head.Current.Runs };
            }

            if (head.Previous is { } previous && previous.SameContent(state))
            {
                return state with { Runs = previous.Runs };
            }

            if (HeadFile.SetAside(_folder) is { } aside)
            {
                _setAside.Add(aside);
            }

            _head = null;
        }

        return ProofReader.Read(_connection, transaction, runs: null);
    }
}
