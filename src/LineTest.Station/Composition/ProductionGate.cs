using LineTest.Storage.Releases;
using LineTest.Storage.Sqlite;

namespace LineTest.Station.Composition;

/// <summary>
/// The production-mode rule: only a sequence file whose SHA-256 is on the release list (the <c>releases</c> table
/// of results.db) and not revoked (<c>release_revocations</c>) may test units. Engineering mode runs any checked file and marks every run <c>engineering</c>.
/// </summary>
public static class ProductionGate
{
    /// <summary>The mode word for production.</summary>
    public const string Production = "production";

    /// <summary>The mode word for engineering.</summary>
    public const string Engineering = "engineering";

    /// <summary>Null when <paramref name="mode"/> may run the file; otherwise the refusal, naming both hashes.</summary>
    public static async Task<string?> RefusalAsync(
        string mode, SqliteResultStore store, string sequenceId, int revision, string sha256, string file, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(store);
        if (mode != Production)
        {
            return null;
        }

        var releases = await store.ReadReleasesAsync(ct).ConfigureAwait(false);
        var revocations = await store.ReadRevocationsAsync(ct).ConfigureAwait(false);
        return ReleaseCheck.Refusal(releases, revocations, sequenceId, revision, sha256, file);
    }
}
