using System.Globalization;
using System.Text.Json;
using LineTest.Factory.Forwarding;
using LineTest.Factory.Schema;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using LineTest.Station.Demo;
using LineTest.Storage.Store;
using Microsoft.Extensions.Logging;
using Npgsql;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest demo --stations N [--factory CONN]</c>: N simulated stations at once, each with its own results folder
/// (<c>DIR/ST-0k</c>), station id, seed and block of serials, <c>--units</c> each; with a factory database each station
/// forwards in the background while it tests, as a real station does, and the demo waits for every backlog to drain.
/// </summary>
internal static class MultiStationDemo
{
    /// <summary>Serials per station: station k's serials start at k × this + 1.</summary>
    public const int SerialBlock = 100_000;

    /// <summary>Most stations one demo runs (the serial counter has 999,999 values).</summary>
    public const int MaxStations = 9;

    public static async Task<int> RunAsync(CliContext context, ShiftOptions template, int stations, string? factory, bool asJson, CancellationToken ct)
    {
        NpgsqlDataSource? dataSource = null;
        try
        {
            dataSource = factory is null ? null : FactoryConnection.Create(factory);
        }
        catch (ArgumentException ex)
        {
            return context.BadInput($"--factory is not a usable connection string: {ex.Message}");
        }

        await using var _ = dataSource;
        var lines = asJson ? context.Error : context.Output;
        var gate = new Lock();
        void Say(string line)
        {
            lock (gate)
            {
                lines.WriteLine(line);
            }
        }

        var plans = Enumerable.Range(0, stations).Select(k => stations == 1
            ? template
            : template with
            {
                Station = string.Create(CultureInfo.InvariantCulture, $"ST-{k + 1:D2}"),
                ResultsDirectory = Path.Combine(template.ResultsDirectory, string.Create(CultureInfo.InvariantCulture, $"ST-{k + 1:D2}")),
                Seed = template.Seed + k,
                FirstSerialCounter = (k * SerialBlock) + 1,
                Notice = Say,

                // Log events carry no one station's simulated time when several run at once.
                ClockStarted = null,
            }).ToList();

        var locks = new List<IDisposable>();
        foreach (var plan in plans)
        {
            if (WriterLock.TakeOrRefuse(plan.ResultsDirectory, context.Clock, context.Error) is not { } taken)
            {
                locks.ForEach(l => l.Dispose());
                return ExitCodes.RuntimeFailure;
            }

            locks.Add(taken);
        }

        using var release = new DisposableSet(locks);
        var forwarder = dataSource is null ? null : new FactoryForwarder(dataSource, TimeProvider.System, context.Loggers.CreateLogger<FactoryForwarder>());
        var forwarding = new FactoryForwardingOptions { PollInterval = TimeSpan.FromSeconds(1), RetryDelay = TimeSpan.FromSeconds(0.5), MaxRetryDelay = TimeSpan.FromSeconds(10) };
        var loops = forwarder is null
            ? []
            : plans.Select(p => new StationForwardingLoop(p.ResultsDirectory, forwarder, forwarding, TimeProvider.System, context.Loggers.CreateLogger<StationForwardingLoop>())).ToList();
        using var stopLoops = CancellationTokenSource.CreateLinkedTokenSource(ct);
        var running = loops.Select(l => Task.Run(() => l.RunAsync(stopLoops.Token), CancellationToken.None)).ToList();
        var shifts = plans.Select(p => new SimulatedShift(p, context.Loggers)).ToList();
        ShiftSummary[] summaries;
        try
        {
            summaries = await Task.WhenAll(shifts.Select((shift, k) => Task.Run(
                () => shift.RunAsync(run => Say($"{plans[k].Station}  {DemoCommand.UnitLine(run)}"), ct), ct))).ConfigureAwait(false);
        }
        catch (Exception ex) when (ex is ResultStoreException or RunStorageException)
        {
            context.Error.WriteLine($"linetest: results could not be stored, the shift was stopped: {ex.Message}");
            return ExitCodes.RuntimeFailure;
        }
        finally
        {
            await stopLoops.CancelAsync().ConfigureAwait(false);
            await Task.WhenAll(running).ConfigureAwait(false);
        }

        if (shifts.Select(s => s.Refusal).FirstOrDefault(r => r is not null) is { } refusal)
        {
            return context.BadInput($"production mode refuses the sequence: {refusal}");
        }

        if (shifts.Select(s => s.Unplaced).FirstOrDefault(r => r is not null) is { } unplaced)
        {
            return context.BadInput($"the shift does not fit before now: {unplaced}");
        }

        foreach (var stopped in shifts.Select(s => s.Stopped).OfType<string>())
        {
            context.Error.WriteLine($"linetest: the shift {stopped}; the runs before the stop are stored");
        }

        for (var k = 0; k < loops.Count; k++)
        {
            if (loops[k].Current.Count > 0 || loops[k].Current.Problem is not null)
            {
                Say($"{plans[k].Station}  {loops[k].Current.Describe()}: waiting for the factory database (Ctrl+C leaves the runs in the outbox)");
            }

            await loops[k].DrainAsync(ct).ConfigureAwait(false);
            await loops[k].DisposeAsync().ConfigureAwait(false);
        }

        if (asJson)
        {
            var items = plans.Select((p, k) => new
            {
                station = p.Station,
                summary = summaries[k],
                factory = k < loops.Count ? loops[k].Current.Describe() : null,
            });
            context.Output.WriteLine(JsonSerializer.Serialize(items));
        }
        else
        {
            var inv = CultureInfo.InvariantCulture;
            context.Output.WriteLine();
            for (var k = 0; k < plans.Count; k++)
            {
                var s = summaries[k];
                context.Output.WriteLine(string.Create(inv, $"{plans[k].Station}: units {s.Units}: {s.Pass} pass, {s.Fail} fail, {s.Error} error; first-pass yield {s.FirstPassYield * 100:F1} %; results in {s.ResultsPath}"));
                if (k < loops.Count)
                {
                    context.Output.WriteLine($"  {loops[k].Current.Describe()}");
                }
            }

            if (dataSource is not null)
            {
                context.Output.WriteLine($"Forwarded to {FactoryConnection.Describe(dataSource)}");
            }
        }

        return summaries.Sum(s => s.Units) == 0 && plans.Sum(p => p.Units) > 0 ? ExitCodes.RuntimeFailure : ExitCodes.Done;
    }
}
