using System.Globalization;
using System.Text.Json;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Station.Demo;

namespace LineTest.Station.Cli;

/// <summary><c>linetest bench --page</c>: runs <see cref="PageBench"/> and prints each shift and the medians.</summary>
internal static class PageBenchOutput
{
    public static async Task<int> RunAsync(
        CliContext context, FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int units, int pairs, (double Line, double Yield) everySeconds, bool json, CancellationToken ct)
    {
        if (units < 1)
        {
            return context.BadInput($"--page needs --shift-units of 1 or more, not {units}");
        }

        if (!(everySeconds.Line >= 0.1) || !(everySeconds.Yield >= 0.1))
        {
            return context.BadInput("--page-line-seconds and --page-yield-seconds must be 0.1 or more");
        }

        if (pairs < 1)
        {
            return context.BadInput($"--pairs must be 1 or more, not {pairs}");
        }

        var progress = json ? TextWriter.Null : context.Output;
        progress.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"Shift of {units} units ({sequence.Id}) with the live page closed and open (live events, line page every {everySeconds.Line} s, yield and a search every {everySeconds.Yield} s), {pairs} pairs after one warm-up pair:"));
        var rounds = await PageBench.RunAsync(fixture, sequence, sha256, units, pairs, context.Options.SimulatorSeed, everySeconds, context.Loggers, progress, ct)
            .ConfigureAwait(false);
        var closed = rounds.Where(r => !r.PageOpen).ToList();
        var open = rounds.Where(r => r.PageOpen).ToList();
        var wallClosed = Median(closed.Select(r => r.Shift.WallSeconds));
        var wallOpen = Median(open.Select(r => r.Shift.WallSeconds));
        var cpuClosed = Median(closed.Select(r => r.Shift.CpuSeconds));
        var cpuOpen = Median(open.Select(r => r.Shift.CpuSeconds));

        // Pairwise: each pair ran back to back under nearly the same load, so its difference is the page's share.
        var pairCpu = Median(Enumerable.Range(0, Math.Min(closed.Count, open.Count)).Select(i => (open[i].Shift.CpuSeconds / closed[i].Shift.CpuSeconds) - 1));
        var pairWall = Median(Enumerable.Range(0, Math.Min(closed.Count, open.Count)).Select(i => (open[i].Shift.WallSeconds / closed[i].Shift.WallSeconds) - 1));
        if (json)
        {
            context.Output.WriteLine(JsonSerializer.Serialize(new
            {
                sequence = sequence.Id,
                units,
                pairs,
                lineEverySeconds = everySeconds.Line,
                yieldEverySeconds = everySeconds.Yield,
                medianWallSecondsClosed = Math.Round(wallClosed, 3),
                medianWallSecondsOpen = Math.Round(wallOpen, 3),
                medianCpuSecondsClosed = Math.Round(cpuClosed, 3),
                medianCpuSecondsOpen = Math.Round(cpuOpen, 3),
                medianPairCpuIncrease = Math.Round(pairCpu, 4),
                medianPairWallIncrease = Math.Round(pairWall, 4),
                rounds = rounds.Select(r => new
                {
                    round = r.Round,
                    page = r.PageOpen ? "open" : "closed",
                    wallSeconds = Math.Round(r.Shift.WallSeconds, 3),
                    cpuSeconds = Math.Round(r.Shift.CpuSeconds, 3),
                    requests = r.Requests,
                    events = r.Events,
                }),
            }));
        }
        else
        {
            var inv = CultureInfo.InvariantCulture;
            context.Output.WriteLine(string.Create(inv, $"Median wall: {wallClosed:F2} s closed, {wallOpen:F2} s open; median CPU (whole process, page included): {cpuClosed:F2} s closed, {cpuOpen:F2} s open"));
            context.Output.WriteLine(string.Create(inv,
                $"Median of the pairs' increase with the page open: process CPU {pairCpu * 100:+0.0;-0.0} %, wall {pairWall * 100:+0.0;-0.0} %"));
        }

        return ExitCodes.Done;
    }

    private static double Median(IEnumerable<double> values)
    {
        var sorted = values.Order().ToList();
        if (sorted.Count == 0)
        {
            return double.NaN;
        }

        var mid = sorted.Count / 2;
        return sorted.Count % 2 == 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
    }
}
