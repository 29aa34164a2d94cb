using LineTest.Station.Cli;
using LineTest.Station.Composition;
using Microsoft.Extensions.Configuration;
using Serilog;

var root = ContentRoot.Find();
var configuration = StationLogging.Configuration(root);
var options = new StationOptions();
configuration.GetSection(StationOptions.Section).Bind(options);
Log.Logger = StationLogging.CreateLogger(configuration);
try
{
    using var loggers = StationLogging.Factory(Log.Logger);
    using var cancel = new CancellationTokenSource();
    Console.CancelKeyPress += (_, e) =>
    {
        e.Cancel = true;
        cancel.Cancel();
    };
    var context = new CliContext(root, configuration, options, Console.Out, Console.Error, loggers);
    return await StationCommandLine.InvokeAsync(context, args, cancel.Token);
}
finally
{
    await Log.CloseAndFlushAsync();
}
