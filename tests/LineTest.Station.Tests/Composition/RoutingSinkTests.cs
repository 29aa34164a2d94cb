using LineTest.Station.Composition;
using Microsoft.Extensions.Time.Testing;
using Serilog;
using Serilog.Core;
using Serilog.Events;

namespace LineTest.Station.Tests.Composition;

public sealed class RoutingSinkTests
{
    [Fact]
    public void Emit_ConsoleClosed_FileOnlyAndWarningsToTheScreen()
    {
        // What broke: with the default settings, log lines went to the terminal the live screen was drawn on.
        var routing = new LogRouting { ConsoleOpen = false };
        var screen = new List<string>();
        routing.ScreenMessage = screen.Add;
        var (file, console, logger) = Build(routing);

        logger.Information("Scanned {Serial}", "CTP40A-2612-000001");
        logger.Warning("The serial scanner on {Port} is lost", "/dev/ttyACM0");

        Assert.Equal(2, file.Events.Count);
        Assert.Empty(console.Events);
        Assert.Equal(["The serial scanner on \"/dev/ttyACM0\" is lost"], screen);
    }

    [Fact]
    public void Emit_ConsoleOpen_BothSinksAndNothingToTheScreen()
    {
        var routing = new LogRouting();
        var screen = new List<string>();
        routing.ScreenMessage = screen.Add;
        var (file, console, logger) = Build(routing);

        logger.Warning("Source standby failed");

        Assert.Single(file.Events);
        Assert.Single(console.Events);
        Assert.Empty(screen);
    }

    [Fact]
    public void Emit_SimulatedClock_EventsStampedWithItsTime()
    {
        // What broke: demo events were all stamped with the same wall-clock second while hours of simulated time passed.
        var simulated = new FakeTimeProvider(new DateTimeOffset(2031, 1, 2, 3, 4, 5, TimeSpan.Zero));
        var routing = new LogRouting { Clock = simulated };
        var (file, _, logger) = Build(routing);

        logger.Information("first");
        simulated.Advance(TimeSpan.FromHours(3));
        logger.Information("second");

        Assert.Equal(
            [new DateTimeOffset(2031, 1, 2, 3, 4, 5, TimeSpan.Zero), new DateTimeOffset(2031, 1, 2, 6, 4, 5, TimeSpan.Zero)],
            file.Events.Select(e => e.Timestamp));
    }

    private static (CollectingSink File, CollectingSink Console, Logger Logger) Build(LogRouting routing)
    {
        var file = new CollectingSink();
        var console = new CollectingSink();
        var logger = new LoggerConfiguration()
            .WriteTo.Sink(new RoutingSink(
                routing,
                new LoggerConfiguration().WriteTo.Sink(file).CreateLogger(),
                new LoggerConfiguration().WriteTo.Sink(console).CreateLogger()))
            .CreateLogger();
        return (file, console, logger);
    }

    private sealed class CollectingSink : ILogEventSink
    {
        public List<LogEvent> Events { get; } = [];

        public void Emit(LogEvent logEvent) => Events.Add(logEvent);
    }
}
