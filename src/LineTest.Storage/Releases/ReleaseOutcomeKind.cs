namespace LineTest.Storage.Releases;

/// <summary>What a release or revocation request did.</summary>
public enum ReleaseOutcomeKind
{
    /// <summary>Recorded.</summary>
    Recorded,

    /// <summary>Nothing to do: the same file is already released, or the release is already revoked.</summary>
    AlreadyDone,

    /// <summary>Refused; the message says why and what to do.</summary>
    Refused,
}
