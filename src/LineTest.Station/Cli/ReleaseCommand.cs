using System.CommandLine;
using LineTest.Station.Composition;
using LineTest.Storage.Releases;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest release SEQUENCE --by NAME [--results DIR]</c>: puts a checked sequence file on the release list kept in
/// results.db (table <c>releases</c>): its SHA-256, id and revision, who released it and when. In production mode only
/// released content runs. Exit 0 released, 1 the list could not be written, 2 the file has problems or bad arguments.
/// </summary>
public static class ReleaseCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var file = new Argument<string>("SEQUENCE") { Description = "The sequence file to release" };
        var by = new Option<string>("--by") { Description = "Who releases it (name or badge)", Required = true };
        var results = new Option<string?>("--results") { Description = "Results folder holding results.db (default: the station's)" };
        var command = new Command("release", "Release a sequence file to production (recorded by its SHA-256)") { file, by, results };
        command.SetAction(async (parse, ct) =>
        {
            var who = parse.GetValue(by)!.Trim();
            if (who.Length == 0)
            {
                return context.BadInput("--by must name who releases the sequence");
            }

            var path = Path.GetFullPath(parse.GetValue(file)!);
            var fixture = DefinitionFiles.LoadFixture(ContentRoot.Resolve(context.Root, context.Options.Fixture), context.Error);
            var sequence = DefinitionFiles.LoadSequence(path, fixture.IsSuccess ? fixture.Value : null, context.Error);
            if (!sequence.IsSuccess)
            {
                return context.BadInput($"{path} was not released: fix the problems above first");
            }

            var folder = parse.GetValue(results) is { } r ? Path.GetFullPath(r) : ContentRoot.Resolve(context.Root, context.Options.Results);
            var release = new Release(sequence.Value!.Id, sequence.Value.Revision, sequence.Sha256!, who, context.Clock.GetUtcNow(), path);
            try
            {
                await using var store = SqliteResultStore.Open(folder);
                await store.AddReleaseAsync(release, ct).ConfigureAwait(false);
                context.Output.WriteLine(
                    $"Released {release.SequenceId} r{release.SequenceRevision}: sha256 {release.Sha256}, by {release.ReleasedBy} at {UtcText.ToText(release.ReleasedUtc)} ({store.DatabasePath})");
            }
            catch (ResultStoreException ex)
            {
                context.Error.WriteLine($"linetest: the release was not recorded: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }

            return ExitCodes.Done;
        });
        return command;
    }
}
