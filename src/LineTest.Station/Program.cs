using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.Station.Hosting;
using Microsoft.Extensions.Configuration;
using Serilog;

var root = ContentRoot.Find();
var configuration = StationLogging.Configuration(root);
var options = new StationOptions();
configuration.GetSection(StationOptions.Section).Bind(options);
var routing = new LogRouting();
Log.Logger = StationLogging.CreateLogger(configuration, routing);
try
{
    using var loggers = StationLogging.Factory(Log.Logger);

    // Ctrl-C and SIGTERM cancel the command, unless the hosted station claims them (it asks before stopping a batch).
    using var signals = StopSignals.Register();
    var context = new CliContext(root, configuration, options, Console.Out, Console.Error, loggers) { Logging = routing, Signals = signals };
    return await StationCommandLine.InvokeAsync(context, args, signals.Token);
}
finally
{
    await Log.CloseAndFlushAsync();
}
