using System.CommandLine;

namespace LineTest.Station.Cli;

/// <summary>The <c>linetest</c> command line: verbs, parsing, and exit codes (0 done, 1 failed at run time, 2 bad input).</summary>
public static class StationCommandLine
{
    /// <summary>Builds the root command with every verb.</summary>
    public static RootCommand Create(CliContext context)
    {
        var root = new RootCommand("LineTest: end-of-line calibration and test station for temperature-sensor modules")
        {
            DemoCommand.Create(context),
            RunCommand.Create(context),
            GraphCommand.Create(context),
            ProbeCommand.Create(context),
            ConvertCommand.Create(context.Output, context.Error),
            CheckCommand.Create(context),
            SchemaCommand.Create(context),
            DryRunCommand.Create(context),
            VerifyCommand.Create(context),
            BackupCommand.Create(context),
            ReportCommand.Create(context),
            ExportCommand.Create(context),
            ReleaseCommand.Create(context),
            CampaignCommand.Create(context),
            BenchCommand.Create(context),
            ServeCommand.Create(context),
        };
        return root;
    }

    /// <summary>Parses and runs <paramref name="args"/>; parse errors give exit code 2.</summary>
    public static async Task<int> InvokeAsync(CliContext context, string[] args, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(context);
        var root = Create(context);
        var parse = root.Parse(args);
        if (parse.Errors.Count > 0)
        {
            foreach (var error in parse.Errors)
            {
                context.Error.WriteLine($"linetest: {error.Message}");
            }

            context.Error.WriteLine("Try 'linetest --help'.");
            return ExitCodes.BadInput;
        }

        var configuration = new InvocationConfiguration { Output = context.Output, Error = context.Error, EnableDefaultExceptionHandler = false };
        return await parse.InvokeAsync(configuration, cancellationToken).ConfigureAwait(false);
    }
}
