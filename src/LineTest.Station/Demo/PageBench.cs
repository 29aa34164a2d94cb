using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Web.Access;
using LineTest.Web.Hosting;
using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Demo;

/// <summary>
/// Does the live page slow a station that serves it (<c>Station:Web:Listen</c>)? The same simulated shift is run in
/// pairs, with the page closed (nobody looking) and open and polled, the order alternating from pair to pair so that a
/// machine's load drifting over the run falls on both sides. As in a station, the page is served by this process and
/// started once, before the first shift; each shift writes a fresh results folder, which the page is switched to.
/// Polled means: the line page open on its live events, the line page fetched every <c>lineEverySeconds</c>, the
/// yield page and a serial search every <c>yieldEverySeconds</c> (by default 1 s and 5 s: far more often than people look).
/// </summary>
public static class PageBench
{
    /// <summary>Runs <paramref name="pairs"/> pairs of shifts of <paramref name="units"/> units, after one pair not counted (warm-up).</summary>
    public static async Task<IReadOnlyList<PageBenchRound>> RunAsync(
        FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int units, int pairs, int seed, (double Line, double Yield) everySeconds,
        ILoggerFactory loggers, TextWriter progress, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(progress);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(pairs);
        var root = Directory.CreateTempSubdirectory("linetest-pagebench-").FullName;
        try
        {
            var source = new SwitchableFolderSource(Path.Combine(root, "start"));
            var setup = new WebPageSetup(ListenAddress.Parse("127.0.0.1:0", out _)!, new WebPageOptions(), source) { Loggers = loggers };
            await using var app = WebPageApp.Create(setup);
            await app.StartAsync(ct).ConfigureAwait(false);
            using var client = new HttpClient { BaseAddress = new Uri(WebPageApp.Addresses(app)[0]), Timeout = TimeSpan.FromMinutes(2) };
            var rounds = new List<PageBenchRound>();
            for (var pair = 0; pair <= pairs; pair++)
            {
                // Pair 0 warms both paths (JIT, SQLite, the page's routes) and is not counted.
                bool[] order = pair % 2 == 0 ? [false, true] : [true, false];
                foreach (var open in order)
                {
                    var folder = Path.Combine(root, $"shift-{rounds.Count + (pair == 0 ? 100 : 1)}-{(open ? "open" : "closed")}");
                    Directory.CreateDirectory(folder);
                    var round = open
                        ? await OpenAsync(client, source, fixture, sequence, sha256, units, seed, folder, everySeconds, loggers, rounds.Count + 1, ct).ConfigureAwait(false)
                        : new PageBenchRound(rounds.Count + 1, false, await ThroughputBench.ShiftAsync(fixture, sequence, sha256, units, seed, folder, loggers, ct).ConfigureAwait(false), 0, 0);
                    progress.WriteLine(string.Create(System.Globalization.CultureInfo.InvariantCulture,
                        $"  {(pair == 0 ? "warm-up" : "pair " + pair)}: page {(open ? "open  " : "closed")} wall {round.Shift.WallSeconds,7:F2} s  process CPU {round.Shift.CpuSeconds,7:F2} s  requests {round.Requests,4}  events {round.Events,4}"));
                    if (pair > 0)
                    {
                        rounds.Add(round);
                    }
                }
            }

            await app.StopAsync(CancellationToken.None).ConfigureAwait(false);
            return rounds;
        }
        finally
        {
            Directory.Delete(root, recursive: true);
        }
    }

    private static async Task<PageBenchRound> OpenAsync(
        HttpClient client, SwitchableFolderSource source, FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int units, int seed, string folder,
        (double Line, double Yield) everySeconds, ILoggerFactory loggers, int number, CancellationToken ct)
    {
        source.SwitchTo(folder);
        using var stop = CancellationTokenSource.CreateLinkedTokenSource(ct);
        var counts = new int[2]; // requests answered, events received
        var events = ListenAsync(client, counts, stop.Token);
        var polls = PollAsync(client, counts, everySeconds, stop.Token);
        try
        {
            var shift = await ThroughputBench.ShiftAsync(fixture, sequence, sha256, units, seed, folder, loggers, ct).ConfigureAwait(false);
            return new PageBenchRound(number, true, shift, counts[0], counts[1]);
        }
        finally
        {
            await stop.CancelAsync().ConfigureAwait(false);
            await Task.WhenAll(events, polls).ConfigureAwait(false);
        }
    }

    private static async Task ListenAsync(HttpClient client, int[] counts, CancellationToken ct)
    {
        try
        {
            using var response = await client.GetAsync("/line/events", HttpCompletionOption.ResponseHeadersRead, ct).ConfigureAwait(false);
            await using var stream = await response.Content.ReadAsStreamAsync(ct).ConfigureAwait(false);
            using var reader = new StreamReader(stream);
            while (await reader.ReadLineAsync(ct).ConfigureAwait(false) is { } line)
            {
                if (line.StartsWith("event:", StringComparison.Ordinal))
                {
                    Interlocked.Increment(ref counts[1]);
                }
            }
        }
        catch (OperationCanceledException) when (ct.IsCancellationRequested)
        {
            // The shift ended.
        }
    }

    private static async Task PollAsync(HttpClient client, int[] counts, (double Line, double Yield) everySeconds, CancellationToken ct)
    {
        var clock = TimeProvider.System;
        var started = clock.GetTimestamp();
        var nextYield = 0.0;
        try
        {
            while (!ct.IsCancellationRequested)
            {
                var elapsed = clock.GetElapsedTime(started).TotalSeconds;
                var paths = elapsed >= nextYield ? new[] { "/", "/yield", "/units?serial=CTP40" } : ["/"];
                if (elapsed >= nextYield)
                {
                    nextYield += everySeconds.Yield;
                }

                foreach (var path in paths)
                {
                    using var response = await client.GetAsync(path, ct).ConfigureAwait(false);
                    await response.Content.ReadAsStringAsync(ct).ConfigureAwait(false);
                    Interlocked.Increment(ref counts[0]);
                }

                await Task.Delay(TimeSpan.FromSeconds(everySeconds.Line), clock, ct).ConfigureAwait(false);
            }
        }
        catch (OperationCanceledException) when (ct.IsCancellationRequested)
        {
            // The shift ended.
        }
    }
}
