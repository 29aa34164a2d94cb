using LineTest.Web.Access;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Hosting;

/// <summary>Registers the live page in the hosted station (<c>Station:Web:Listen</c>).</summary>
public static class StationWebPageExtensions
{
    /// <summary>
    /// When <c>Station:Web:Listen</c> is set, serves the live page beside the station, read-only on
    /// <paramref name="resultsDirectory"/>; otherwise does nothing. Bad settings (a bad address, another computer
    /// allowed without a credential) throw here, before the station starts, with every problem in one message.
    /// </summary>
    /// <returns>True when the page was registered.</returns>
    /// <exception cref="InvalidOperationException">The Station:Web settings have problems.</exception>
    public static bool AddStationWebPage(this IServiceCollection services, IConfiguration configuration, string resultsDirectory)
    {
        ArgumentNullException.ThrowIfNull(services);
        ArgumentNullException.ThrowIfNull(configuration);
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsDirectory);
        var options = new WebPageOptions();
        configuration.GetSection(WebPageOptions.Section).Bind(options);
        if (string.IsNullOrWhiteSpace(options.Listen))
        {
            return false;
        }

        var listen = ListenAddress.Parse(options.Listen, out var error)
            ?? throw new InvalidOperationException("Station:Web:Listen " + error);
        var (shifts, shiftError, shiftWarning) = ShiftSettings.Read(configuration);
        var problems = options.Validate(listen).Concat(shiftError is null ? [] : [shiftError]).ToList();
        if (problems.Count > 0)
        {
            throw new InvalidOperationException("The live page cannot start: " + string.Join("; ", problems));
        }

        var folder = Path.GetFullPath(resultsDirectory);
        services.AddSingleton<IHostedService>(provider =>
        {
            var loggers = provider.GetRequiredService<ILoggerFactory>();
            if (shiftWarning is not null)
            {
                ShiftSettings.LogDeprecation(loggers.CreateLogger(typeof(ShiftSettings)), shiftWarning);
            }

            return new StationWebPageService(StationWebPageService.Setup(
                listen,
                options,
                folder,
                provider.GetService<TimeProvider>() ?? TimeProvider.System,
                loggers,
                provider.GetService<Factory.Forwarding.IFactoryBacklog>()) with { Shifts = shifts! });
        });
        return true;
    }
}
