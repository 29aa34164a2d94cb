using System.Globalization;
using System.Text.Json;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Station.Demo;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest bench --accuracy [--json]</c>: per sequence and fit objective, the true post-trim error over the rated
/// range (RMS and largest), the error budget's floor, their ratio and the bias at the verify setpoint. JSON: an array of
/// objects with exactly the keys <c>sequence</c>, <c>fit</c>, <c>rmsErrorC</c>, <c>maxAbsErrorC</c>, <c>floorRmsC</c>,
/// <c>ratio</c>, <c>verifyBiasC</c>.
/// </summary>
public static class AccuracyCommand
{
    /// <summary>Runs the accuracy benchmark and prints it; exit code.</summary>
    public static async Task<int> RunAsync(
        CliContext context, FixtureDefinition fixture, IReadOnlyList<SequenceDefinition> sequences, int batches, bool json, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequences);
        if (batches < 1)
        {
            return context.BadInput($"--accuracy-batches must be 1 or more, not {batches}");
        }

        var missing = sequences.FirstOrDefault(s => s.RatedRange is null);
        if (missing is not null)
        {
            return context.BadInput($"sequence '{missing.Id}' states no ratedRange: --accuracy measures the error over the rated range");
        }

        var figures = new List<AccuracyFigures>();
        foreach (var sequence in sequences)
        {
            foreach (var (fit, variant) in AccuracyBench.Variants(sequence))
            {
                figures.Add(await AccuracyBench.MeasureAsync(fixture, variant, fit, batches, context.Options.SimulatorSeed, null, ct).ConfigureAwait(false));
            }
        }

        if (json)
        {
            context.Output.WriteLine(JsonSerializer.Serialize(figures.Select(f => new
            {
                sequence = f.SequenceId,
                fit = f.Fit,
                rmsErrorC = Round(f.RmsErrorC, 4),
                maxAbsErrorC = Round(f.MaxAbsErrorC, 4),
                floorRmsC = Round(f.FloorRmsC, 4),
                ratio = Round(f.Ratio, 3),
                verifyBiasC = Round(f.VerifyBiasC, 4),
            })));
        }
        else
        {
            Write(context.Output, fixture.Id, figures);
        }

        return ExitCodes.Done;
    }

    /// <summary>A signed figure at four decimals with one sign: a value that rounds to zero prints as +0.0000.</summary>
    internal static string Signed(double value) =>
        (Math.Round(value, 4, MidpointRounding.AwayFromZero) + 0.0).ToString("+0.0000;-0.0000", CultureInfo.InvariantCulture);

    private static double? Round(double value, int digits) => double.IsFinite(value) ? Math.Round(value, digits) : null;

    private static void Write(TextWriter o, string fixtureId, List<AccuracyFigures> figures)
    {
        var inv = CultureInfo.InvariantCulture;
        o.WriteLine($"True post-trim error over each sequence's rated range on fixture {fixtureId} (simulator ground truth, passing units)");
        o.WriteLine();
        o.WriteLine("sequence             fit              units  rms degC  max|e| degC  floor rms  ratio  verify bias  verify reading mean/sd  predicted mean/sd");
        foreach (var f in figures)
        {
            o.WriteLine(string.Create(inv,
                $"{f.SequenceId,-20} {f.Fit,-15} {f.Units,6}  {f.RmsErrorC,8:F4}  {f.MaxAbsErrorC,11:F4}  {f.FloorRmsC,9:F4}  {f.Ratio,5:F2}  {Signed(f.VerifyBiasC),11}  {Signed(f.VerifyReadingMeanC),11}/{f.VerifyReadingSdC:F4}  {Signed(f.PredictedVerifyMeanC),9}/{f.PredictedVerifySdC:F4}"));
        }

        // The linear variants' target: minimax's largest error as a share of the line through the points', per sequence.
        o.WriteLine();
        foreach (var group in figures.GroupBy(f => f.SequenceId))
        {
            var minimax = group.FirstOrDefault(f => f.Fit == TrimFits.Minimax);
            var through = group.FirstOrDefault(f => f.Fit == TrimFits.ThroughPoints);
            if (minimax is not null && through is not null && through.MaxAbsErrorC > 0)
            {
                o.WriteLine(string.Create(inv,
                    $"{group.Key,-20} max|e| minimax / through-points = {minimax.MaxAbsErrorC:F4} / {through.MaxAbsErrorC:F4} = {minimax.MaxAbsErrorC / through.MaxAbsErrorC:F3}"));
            }
        }

        var decomposed = figures.Where(f => f.Stages.Count > 0).ToList();
        if (decomposed.Count == 0)
        {
            return;
        }

        o.WriteLine();
        o.WriteLine("Where the error of a gain-and-offset trim comes from (ground truth; each stage adds one source to the ones above it):");
        o.WriteLine();
        o.WriteLine("sequence             fit              stage                         max|e| degC  rms degC   adds max  adds rms");
        foreach (var f in decomposed)
        {
            foreach (var s in f.Stages)
            {
                o.WriteLine(string.Create(inv,
                    $"{f.SequenceId,-20} {f.Fit,-15}  {s.Name,-28} {s.MaxAbsErrorC,11:F4}  {s.RmsErrorC,8:F4}  {s.StepMaxAbsC,9:F4}  {s.StepRmsC,8:F4}"));
            }

            if (f.DecompositionMismatches > 0)
            {
                o.WriteLine(string.Create(inv, $"{f.SequenceId,-20} {f.Fit,-15}  ({f.DecompositionMismatches} units' trims could not be recomputed exactly: the stages are approximate)"));
            }
        }
    }
}
