using Microsoft.Extensions.Configuration;
using Serilog;
using Serilog.Extensions.Logging;

namespace LineTest.Station.Composition;

/// <summary>
/// Serilog set up from appsettings.json (console and rolling JSON file); diagnostics never stop the station. The
/// sinks of the <c>Serilog:WriteTo</c> section named <c>Console</c> are routed through <see cref="LogRouting"/> so
/// that the live screen and <c>demo</c> can keep log lines off the terminal; every other sink gets every event.
/// </summary>
public static class StationLogging
{
    private const string Section = "Serilog";

    /// <summary>Reads the configuration from <paramref name="contentRoot"/>.</summary>
    public static IConfigurationRoot Configuration(string contentRoot) =>
        new ConfigurationBuilder()
            .SetBasePath(contentRoot)
            .AddJsonFile("appsettings.json", optional: true, reloadOnChange: false)
            .AddEnvironmentVariables("LINETEST_")
            .Build();

    /// <summary>Builds the Serilog logger configured in the <c>Serilog</c> section, its console routed by <paramref name="routing"/>.</summary>
    public static Serilog.Core.Logger CreateLogger(IConfiguration configuration, LogRouting? routing = null)
    {
        ArgumentNullException.ThrowIfNull(configuration);
        routing ??= new LogRouting();
        var pairs = configuration.GetSection(Section).AsEnumerable(makePathsRelative: true)
            .Where(kv => kv.Value is not null)
            .ToDictionary(kv => kv.Key, kv => kv.Value, StringComparer.OrdinalIgnoreCase);
        var sinks = pairs.Keys
            .Where(k => k.StartsWith("WriteTo:", StringComparison.OrdinalIgnoreCase))
            .Select(k => k.Split(':')[1])
            .Distinct(StringComparer.Ordinal)
            .ToList();
        var console = sinks.Where(i => string.Equals(pairs.GetValueOrDefault($"WriteTo:{i}:Name"), "Console", StringComparison.OrdinalIgnoreCase)).ToList();
        var files = sinks.Except(console).ToList();
        var levels = pairs.Where(kv => !kv.Key.StartsWith("WriteTo", StringComparison.OrdinalIgnoreCase));
        var outer = new LoggerConfiguration().ReadFrom.Configuration(Build(levels));
        return outer
            .Enrich.FromLogContext()
            .WriteTo.Sink(new RoutingSink(routing, SinksOf(pairs, files), SinksOf(pairs, console)))
            .CreateLogger();
    }

    /// <summary>A Microsoft.Extensions.Logging factory over a Serilog logger.</summary>
    public static Microsoft.Extensions.Logging.ILoggerFactory Factory(Serilog.ILogger logger) =>
        new SerilogLoggerFactory(logger, dispose: false);

    // A logger holding only the sinks at the given WriteTo indexes (renumbered), letting through whatever reaches it.
    private static Serilog.Core.Logger SinksOf(Dictionary<string, string?> pairs, List<string> indexes)
    {
        var selected = pairs.Where(kv => kv.Key.StartsWith("Using", StringComparison.OrdinalIgnoreCase)).ToList();
        for (var n = 0; n < indexes.Count; n++)
        {
            var prefix = $"WriteTo:{indexes[n]}";
            selected.AddRange(pairs
                .Where(kv => kv.Key.Equals(prefix, StringComparison.OrdinalIgnoreCase) || kv.Key.StartsWith(prefix + ":", StringComparison.OrdinalIgnoreCase))
                .Select(kv => new KeyValuePair<string, string?>($"WriteTo:{n}{kv.Key[prefix.Length..]}", kv.Value)));
        }

        return new LoggerConfiguration().MinimumLevel.Verbose().ReadFrom.Configuration(Build(selected)).CreateLogger();
    }

    private static IConfigurationRoot Build(IEnumerable<KeyValuePair<string, string?>> pairs) =>
        new ConfigurationBuilder().AddInMemoryCollection(pairs.Select(kv => new KeyValuePair<string, string?>($"{Section}:{kv.Key}", kv.Value))).Build();
}
