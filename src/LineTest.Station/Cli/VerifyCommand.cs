using System.CommandLine;
using LineTest.Storage.Proof;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest verify --results DIR [--expect-head SEQ:HASH]</c>: walks the hash chain of the stored runs, checks every
/// readings row against its run, and compares the database with <c>results.head</c>, with its own seq counter, with heads
/// the station set aside and with an anchor written down elsewhere. Lists every problem (the first
/// <see cref="ListLimit"/>, then how many more). Exit 0 intact, 1 any problem, 2 no usable database or bad arguments.
/// Takes no lock: it can run while a station writes.
/// </summary>
public static class VerifyCommand
{
    /// <summary>How many problems are printed before "... and N more".</summary>
    public const int ListLimit = 50;

    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var results = new Option<string>("--results") { Description = "Results folder holding results.db", DefaultValueFactory = _ => "results" };
        var expect = new Option<string?>("--expect-head") { Description = "A head written down earlier (SEQ:HASH, as demo, report and verify print it): that run must still be stored" };
        var command = new Command("verify", "Check that no stored run was changed, inserted or deleted, and that none is missing from the end") { results, expect };
        command.SetAction(async (parse, ct) =>
        {
            var folder = Path.GetFullPath(parse.GetValue(results)!);
            var path = ResultsDatabase.PathIn(folder);
            (long Seq, string Sha256)? anchor = null;
            if (parse.GetValue(expect) is { } text)
            {
                anchor = HeadState.ParseAnchor(text);
                if (anchor is null)
                {
                    return context.BadInput($"--expect-head '{text}' is not SEQ:HASH (a seq number, a colon and a 64-digit SHA-256)");
                }
            }

            if (!File.Exists(path))
            {
                return context.BadInput($"no results database at {path}");
            }

            ProofReport report;
            try
            {
                report = await ProofVerifier.VerifyAsync(folder, anchor, ct).ConfigureAwait(false);
            }
            catch (Exception ex) when (ex is SqliteException or ResultStoreException or IOException)
            {
                return context.BadInput($"{path} cannot be read as a results database: {ex.Message}");
            }

            foreach (var note in report.Notes)
            {
                context.Output.WriteLine($"  note: {note}");
            }

            if (!report.IsIntact)
            {
                context.Output.WriteLine(
                    $"{path}: NOT INTACT: {report.ProblemCount} problem{(report.ProblemCount == 1 ? string.Empty : "s")} ({report.Chain.RunsChecked} runs intact before the first problem of the chain)");
                var shown = 0;
                foreach (var line in report.ProblemLines().Take(ListLimit))
                {
                    context.Output.WriteLine($"  {line}");
                    shown++;
                }

                if (report.ProblemCount > shown)
                {
                    context.Output.WriteLine($"  ... and {report.ProblemCount - shown} more");
                }

                return ExitCodes.RuntimeFailure;
            }

            context.Output.WriteLine($"{path}: intact, {report.Database.Runs} runs, head {report.Database.Anchor}");
            return ExitCodes.Done;
        });
        return command;
    }
}
