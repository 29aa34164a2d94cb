namespace LineTest.Storage.Releases;

/// <summary>A released sequence file taken back: production refuses it from then on.</summary>
/// <param name="Sha256">SHA-256 of the revoked file, lower-case hex.</param>
/// <param name="RevokedBy">Who revoked it (name or badge).</param>
/// <param name="RevokedUtc">When.</param>
/// <param name="Reason">Why, in the words of the person who revoked it.</param>
public sealed record Revocation(string Sha256, string RevokedBy, DateTimeOffset RevokedUtc, string Reason);
