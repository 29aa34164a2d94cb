using LineTest.Factory.Schema;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;
using Microsoft.Extensions.Logging;

namespace LineTest.Factory.Forwarding;

/// <summary>Registers the station's forwarder with a host.</summary>
public static class FactoryForwardingRegistration
{
    /// <summary>
    /// When <c>Station:Factory:ConnectionString</c> is set, registers the background forwarder of
    /// <paramref name="resultsDirectory"/> and <see cref="IFactoryBacklog"/> (for the screen); otherwise registers
    /// nothing and returns false. Needs a <see cref="TimeProvider"/> (the system clock is added if none) and logging.
    /// </summary>
    /// <exception cref="ArgumentException">The settings are not usable; the message lists every problem.</exception>
    public static bool AddFactoryForwarding(this IServiceCollection services, IConfiguration configuration, string resultsDirectory)
    {
        ArgumentNullException.ThrowIfNull(services);
        ArgumentNullException.ThrowIfNull(configuration);
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsDirectory);
        var options = new FactoryForwardingOptions();
        configuration.GetSection(FactoryForwardingOptions.Section).Bind(options);
        if (string.IsNullOrWhiteSpace(options.ConnectionString))
        {
            return false;
        }

        if (options.Validate() is { Count: > 0 } problems)
        {
            throw new ArgumentException("appsettings.json: " + string.Join("; ", problems), nameof(configuration));
        }

        services.TryAddSingleton(TimeProvider.System);
        services.AddSingleton(options);
        services.AddSingleton(_ => FactoryConnection.Create(options.ConnectionString));
        services.AddSingleton(sp => new FactoryForwarder(
            sp.GetRequiredService<Npgsql.NpgsqlDataSource>(), sp.GetRequiredService<TimeProvider>(), sp.GetRequiredService<ILogger<FactoryForwarder>>(), options.BatchSize));
        services.AddSingleton(sp => new StationForwardingLoop(
            resultsDirectory,
            sp.GetRequiredService<FactoryForwarder>(),
            options,
            sp.GetRequiredService<TimeProvider>(),
            sp.GetRequiredService<ILogger<StationForwardingLoop>>()));
        services.AddSingleton<IFactoryBacklog>(sp => sp.GetRequiredService<StationForwardingLoop>());
        services.AddHostedService<FactoryForwardingService>();
        return true;
    }
}
