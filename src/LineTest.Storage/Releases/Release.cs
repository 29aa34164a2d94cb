namespace LineTest.Storage.Releases;

/// <summary>One sequence file released to production: its content hash, which sequence it is, who released it and when.</summary>
/// <param name="SequenceId">The sequence id inside the file.</param>
/// <param name="SequenceRevision">The sequence revision inside the file.</param>
/// <param name="Sha256">SHA-256 of the file's bytes (FIPS 180-4), lower-case hex.</param>
/// <param name="ReleasedBy">Who released it (name or badge).</param>
/// <param name="ReleasedUtc">When it was released.</param>
/// <param name="File">The file's path when it was released (for people; the hash is what counts).</param>
public sealed record Release(string SequenceId, int SequenceRevision, string Sha256, string ReleasedBy, DateTimeOffset ReleasedUtc, string File);
