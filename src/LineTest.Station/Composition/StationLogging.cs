using Microsoft.Extensions.Configuration;
using Serilog;
using Serilog.Extensions.Logging;

namespace LineTest.Station.Composition;

/// <summary>Serilog set up from appsettings.json (console and rolling JSON file); diagnostics never stop the station.</summary>
public static class StationLogging
{
    /// <summary>Reads the configuration from <paramref name="contentRoot"/>.</summary>
    public static IConfigurationRoot Configuration(string contentRoot) =>
        new ConfigurationBuilder()
            .SetBasePath(contentRoot)
            .AddJsonFile("appsettings.json", optional: true, reloadOnChange: false)
            .AddEnvironmentVariables("LINETEST_")
            .Build();

    /// <summary>Builds the Serilog logger configured in the <c>Serilog</c> section.</summary>
    public static Serilog.Core.Logger CreateLogger(IConfiguration configuration) =>
        new LoggerConfiguration()
            .ReadFrom.Configuration(configuration)
            .Enrich.FromLogContext()
            .CreateLogger();

    /// <summary>A Microsoft.Extensions.Logging factory over a Serilog logger.</summary>
    public static Microsoft.Extensions.Logging.ILoggerFactory Factory(Serilog.ILogger logger) =>
        new SerilogLoggerFactory(logger, dispose: false);
}
