namespace LineTest.Storage.Sqlite;

/// <summary>A journal entry removed at recovery because a run with its id was already stored.</summary>
/// <param name="Id">The run id as the entry held it.</param>
/// <param name="Serial">The entry's serial.</param>
/// <param name="Slot">The entry's slot.</param>
public sealed record RemovedJournalEntry(string Id, string Serial, long Slot);
