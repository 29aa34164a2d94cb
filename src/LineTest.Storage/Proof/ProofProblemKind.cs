namespace LineTest.Storage.Proof;

/// <summary>What kind of problem the proof check found beyond the hash chain.</summary>
public enum ProofProblemKind
{
    /// <summary>Runs the head, the database's own seq counter or an expected anchor proves were stored are gone.</summary>
    RunsMissing,

    /// <summary>The run at the head's seq is another run: the database was rolled back or replaced and written since.</summary>
    RunReplaced,

    /// <summary>Runs after the head's seq that no head covers: stored outside LineTest.</summary>
    NotCoveredByHead,

    /// <summary>The number of runs differs from the head's.</summary>
    RunCountDiffers,

    /// <summary>The release list (releases and revocations) differs from the head's digest.</summary>
    ReleasesChanged,

    /// <summary>A journal entry differs from the head's, was added or was removed.</summary>
    JournalChanged,

    /// <summary>A run stored at start-up from a journal entry the head did not prove, or that could not be read.</summary>
    JournalRunUnproven,

    /// <summary>There is no head file beside a database that holds data.</summary>
    HeadMissing,

    /// <summary>The head file cannot be read.</summary>
    HeadUnreadable,

    /// <summary>A head the station set aside because the database no longer matched it.</summary>
    HeadSetAside,
}
