using System.CommandLine;
using LineTest.Factory.Forwarding;
using LineTest.Station.Composition;
using LineTest.Station.Hosting;
using LineTest.Web.Hosting;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Serilog;

namespace LineTest.Station.Cli;

/// <summary><c>linetest run</c>: the hosted station, configured from appsettings.json.</summary>
public static class RunCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var command = new Command("run", "Start the station from appsettings.json (serials typed, from a keyboard-wedge scanner, or from the fixture's serial scanner)");
        command.SetAction(async (parse, ct) =>
        {
            var problems = context.Options.Validate();
            if (problems.Count > 0)
            {
                foreach (var problem in problems)
                {
                    context.Error.WriteLine($"linetest: appsettings.json: {problem}");
                }

                return ExitCodes.BadInput;
            }

            // One writer per results folder: refused at once, before the rig is opened or recovery looks at the journal.
            using var writer = WriterLock.TakeOrRefuse(ContentRoot.Resolve(context.Root, context.Options.Results), context.Clock, context.Error);
            if (writer is null)
            {
                return ExitCodes.RuntimeFailure;
            }

            var builder = Host.CreateApplicationBuilder(new HostApplicationBuilderSettings
            {
                ContentRootPath = context.Root,
                Configuration = new Microsoft.Extensions.Configuration.ConfigurationManager(),
                DisableDefaults = true,
            });
            builder.Configuration.AddConfiguration(context.Configuration);
            builder.Services.AddSerilog(Log.Logger, dispose: false);
            builder.Services.AddSingleton(new StationServiceContext(context.Root, context.Options, Console.In, context.Output, context.Error)
            {
                Logging = context.Logging,
                Signals = context.Signals,
            });
            builder.Services.AddSingleton<IHostLifetime, QuietLifetime>();
            builder.Services.AddSingleton<StationService>();
            builder.Services.AddHostedService(sp => sp.GetRequiredService<StationService>());
            try
            {
                // Store-and-forward to the factory database when Station:Factory:ConnectionString is set.
                builder.Services.AddFactoryForwarding(context.Configuration, ContentRoot.Resolve(context.Root, context.Options.Results));

                // The live page beside the station, read-only on its own folder, when Station:Web:Listen is set.
                builder.Services.AddStationWebPage(context.Configuration, ContentRoot.Resolve(context.Root, context.Options.Results));
            }
            catch (Exception ex) when (ex is ArgumentException or InvalidOperationException)
            {
                return context.BadInput(ex.Message);
            }

            using var host = builder.Build();
            var station = host.Services.GetRequiredService<StationService>();

            // RunAsync disposes the host's services when it returns: keep the service, not the provider.
            await host.RunAsync(ct).ConfigureAwait(false);
            return station.ExitCode;
        });
        return command;
    }
}
