using LineTest.Core.Results;

namespace LineTest.Storage.Sqlite;

/// <summary>What a start-up recovery did with the journal of runs in progress.</summary>
/// <param name="Stored">Runs stored from the journal (verdict error; reason interrupted, journal-unproven or journal-unreadable).</param>
/// <param name="Removed">Journal entries removed because their run was already stored (never stored twice).</param>
public sealed record JournalRecovery(IReadOnlyList<RunRecord> Stored, IReadOnlyList<RemovedJournalEntry> Removed);
