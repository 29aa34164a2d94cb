using LineTest.Web.Access;
using LineTest.Web.Live;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Hosting;

/// <summary>Builds the page's web application (Kestrel) from a checked <see cref="WebPageSetup"/>.</summary>
public static class WebPageApp
{
    /// <summary>
    /// Why the page cannot listen on <paramref name="listen"/> now (its port held by another program, an address this
    /// computer does not have), or null when it can: asked before the web host is made, whose own failed start would
    /// log an error with a stack trace. Port 0 (any free port) always can.
    /// </summary>
    public static string? CannotListen(ListenAddress listen)
    {
        ArgumentNullException.ThrowIfNull(listen);
        try
        {
            var probe = new System.Net.Sockets.TcpListener(listen.Address, listen.Port);
            probe.Start();
            probe.Stop();
            return null;
        }
        catch (System.Net.Sockets.SocketException ex)
        {
            return ex.Message;
        }
    }

    /// <summary>
    /// Builds the application. <paramref name="configure"/> may change the builder before it is built (tests put
    /// the test server in Kestrel's place).
    /// </summary>
    /// <exception cref="InvalidOperationException">The setup has problems (call <see cref="WebPageSetup.Check"/> first to say them).</exception>
    public static WebApplication Create(WebPageSetup setup, Action<WebApplicationBuilder>? configure = null)
    {
        ArgumentNullException.ThrowIfNull(setup);
        var problems = setup.Check();
        if (problems.Count > 0)
        {
            throw new InvalidOperationException("The live page cannot start: " + string.Join("; ", problems));
        }

        // Content root: this program's folder, so the page does not depend on where it was started from; no
        // settings are read by the builder (the caller bound Station:Web already).
        var builder = WebApplication.CreateSlimBuilder(new WebApplicationOptions
        {
            ApplicationName = typeof(WebPageApp).Assembly.GetName().Name,
            ContentRootPath = AppContext.BaseDirectory,
            Args = [],
        });
        if (setup.Loggers is { } loggers)
        {
            builder.Logging.ClearProviders();
            builder.Services.AddSingleton(loggers);
        }

        builder.WebHost.ConfigureKestrel(kestrel =>
        {
            kestrel.AddServerHeader = false;
            kestrel.Listen(setup.Listen.Address, setup.Listen.Port);
        });
        builder.Services.AddSingleton(setup.Options);
        builder.Services.AddSingleton(setup.Source);
        builder.Services.AddSingleton(setup.Time);
        builder.Services.AddSingleton(new ShiftCalendar(setup.Shifts.Starts));
        builder.Services.AddSingleton(new WebCredentials(setup.Options));
        builder.Services.AddSingleton<LineMonitor>();
        builder.Services.AddSingleton<PageSnapshots>();
        configure?.Invoke(builder);

        var app = builder.Build();
        app.UseMiddleware<AccessGate>();
        WebPageEndpoints.Map(app);
        var logger = app.Services.GetRequiredService<ILoggerFactory>().CreateLogger(typeof(WebPageApp));
        app.Lifetime.ApplicationStarted.Register(() =>
            AccessLog.Listening(logger, string.Join(", ", Addresses(app)), setup.Source.Description, !setup.Listen.IsLoopback));
        return app;
    }

    /// <summary>The addresses the server listens on once started (e.g. http://127.0.0.1:5080).</summary>
    public static IReadOnlyList<string> Addresses(WebApplication app)
    {
        ArgumentNullException.ThrowIfNull(app);
        return [.. app.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()?.Addresses ?? []];
    }
}
