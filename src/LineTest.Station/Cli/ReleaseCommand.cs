using System.CommandLine;
using LineTest.Station.Composition;
using LineTest.Storage.Releases;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest release SEQUENCE --by NAME [--results DIR]</c>: puts a checked sequence file on the release list kept in
/// results.db (table <c>releases</c>): its SHA-256, id and revision, who released it and when. In production mode only
/// released, unrevoked content runs. The same file twice changes nothing; another content under a released id and
/// revision is refused (raise the revision). <c>release --list</c> prints the list; <c>release --revoke SHA --by NAME
/// --reason TEXT</c> takes a release back. Writing takes the results folder's writer lock; listing does not.
/// Exit 0 done (or nothing to do), 1 refused by the release list or not written, 2 the file has problems or bad arguments.
/// </summary>
public static class ReleaseCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var file = new Argument<string?>("SEQUENCE") { Description = "The sequence file to release", Arity = ArgumentArity.ZeroOrOne };
        var by = new Option<string?>("--by") { Description = "Who releases or revokes (name or badge)" };
        var results = new Option<string?>("--results") { Description = "Results folder holding results.db (default: the station's)" };
        var list = new Option<bool>("--list") { Description = "Print the release list with revocations" };
        var revoke = new Option<string?>("--revoke") { Description = "Revoke the released file with this SHA-256 (or its first 8+ hex digits)" };
        var reason = new Option<string?>("--reason") { Description = "Why the release is revoked (with --revoke)" };
        var command = new Command("release", "Release a sequence file to production (recorded by its SHA-256), list or revoke releases")
        {
            file, by, results, list, revoke, reason,
        };
        command.SetAction(async (parse, ct) =>
        {
            var folder = parse.GetValue(results) is { } r ? Path.GetFullPath(r) : ContentRoot.Resolve(context.Root, context.Options.Results);
            var sequenceFile = parse.GetValue(file);
            var revokeSha = parse.GetValue(revoke);
            var modes = (sequenceFile is null ? 0 : 1) + (parse.GetValue(list) ? 1 : 0) + (revokeSha is null ? 0 : 1);
            if (modes != 1)
            {
                return context.BadInput("give one of: SEQUENCE --by NAME, --list, or --revoke SHA --by NAME --reason TEXT");
            }

            if (parse.GetValue(list))
            {
                return await ListAsync(context, folder, ct).ConfigureAwait(false);
            }

            var who = parse.GetValue(by)?.Trim() ?? string.Empty;
            if (who.Length == 0)
            {
                return context.BadInput($"--by must name who {(revokeSha is null ? "releases the sequence" : "revokes the release")}");
            }

            Release? release = null;
            if (sequenceFile is not null)
            {
                var path = Path.GetFullPath(sequenceFile);
                var fixture = DefinitionFiles.LoadFixture(ContentRoot.Resolve(context.Root, context.Options.Fixture), context.Error);
                var sequence = DefinitionFiles.LoadSequence(path, fixture.IsSuccess ? fixture.Value : null, context.Error);
                if (!sequence.IsSuccess)
                {
                    return context.BadInput($"{path} was not released: fix the problems above first");
                }

                release = new Release(sequence.Value!.Id, sequence.Value.Revision, sequence.Sha256!, who, context.Clock.GetUtcNow(), path);
            }

            var why = parse.GetValue(reason)?.Trim() ?? string.Empty;
            if (revokeSha is not null && why.Length == 0)
            {
                return context.BadInput("--reason must say why the release is revoked");
            }

            using var writer = WriterLock.TakeOrRefuse(folder, context.Clock, context.Error);
            if (writer is null)
            {
                return ExitCodes.RuntimeFailure;
            }

            try
            {
                await using var store = SqliteResultStore.Open(folder, clock: context.Clock);
                var outcome = release is not null
                    ? await store.AddReleaseAsync(release, ct).ConfigureAwait(false)
                    : await store.RevokeAsync(revokeSha!, who, why, context.Clock.GetUtcNow(), ct).ConfigureAwait(false);
                if (outcome.Kind == ReleaseOutcomeKind.Refused)
                {
                    context.Error.WriteLine($"linetest: refused: {outcome.Message}");
                    return ExitCodes.RuntimeFailure;
                }

                context.Output.WriteLine($"{outcome.Message} ({store.DatabasePath})");
            }
            catch (ResultStoreException ex)
            {
                context.Error.WriteLine($"linetest: the release list was not changed: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }

            return ExitCodes.Done;
        });
        return command;
    }

    private static async Task<int> ListAsync(CliContext context, string folder, CancellationToken ct)
    {
        var path = ResultsDatabase.PathIn(folder);
        if (!File.Exists(path))
        {
            return context.BadInput($"no results database at {path}");
        }

        try
        {
            var (releases, revocations) = await ReleaseList.ReadAsync(path, ct).ConfigureAwait(false);
            if (releases.Count == 0)
            {
                context.Output.WriteLine($"No sequence is released in {path}.");
                return ExitCodes.Done;
            }

            foreach (var release in releases)
            {
                var revoked = revocations.FirstOrDefault(v => v.Sha256 == release.Sha256);
                context.Output.WriteLine(
                    $"{release.SequenceId} r{release.SequenceRevision}  {release.Sha256}  released by {release.ReleasedBy} at {UtcText.ToText(release.ReleasedUtc)}  "
                    + (revoked is null ? "in production" : $"REVOKED by {revoked.RevokedBy} at {UtcText.ToText(revoked.RevokedUtc)}: {revoked.Reason}"));
                context.Output.WriteLine($"    {release.File}");
            }
        }
        catch (ResultStoreException ex)
        {
            context.Error.WriteLine($"linetest: {ex.Message}");
            return ExitCodes.RuntimeFailure;
        }

        return ExitCodes.Done;
    }
}
