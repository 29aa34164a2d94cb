using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.Station.Hosting;
using Microsoft.Extensions.Configuration;
using Serilog;

var root = ContentRoot.Find();
var (configuration, options, settingsError) = StationSettings.Load(root);
if (settingsError is not null)
{
    Console.Error.WriteLine($"linetest: {settingsError.TrimEnd('.')}. Fix the setting, then start again.");
    return ExitCodes.BadInput;
}

var routing = new LogRouting();
try
{
    Log.Logger = StationLogging.CreateLogger(configuration!, routing);
}
catch (Exception ex) when (ex is InvalidOperationException or ArgumentException or FormatException)
{
    Console.Error.WriteLine($"linetest: the Serilog section of the settings cannot be used: {ex.Message} Fix the setting, then start again.");
    return ExitCodes.BadInput;
}

try
{
    using var loggers = StationLogging.Factory(Log.Logger);

    // Ctrl-C and SIGTERM cancel the command, unless the hosted station claims them (it asks before stopping a batch).
    using var signals = StopSignals.Register();
    var context = new CliContext(root, configuration!, options!, Console.Out, Console.Error, loggers) { Logging = routing, Signals = signals };
    return await StationCommandLine.InvokeAsync(context, args, signals.Token);
}
finally
{
    await Log.CloseAndFlushAsync();
}
