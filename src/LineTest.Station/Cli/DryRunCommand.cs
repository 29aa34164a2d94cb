using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using LineTest.Station.Composition;
using LineTest.Station.Demo;

namespace LineTest.Station.Cli;

/// <summary><c>linetest dry-run SEQUENCE</c>: the sequence on the simulator in accelerated time, with the predicted cycle time.</summary>
public static class DryRunCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var sequence = new Argument<string>("SEQUENCE") { Description = "Sequence file" };
        var fixture = new Option<string?>("--fixture") { Description = "Simulated fixture (default: the station's)" };
        var units = new Option<int?>("--units") { Description = "Units in the batch (default: every slot)" };
        var json = new Option<bool>("--json") { Description = "Print batchSeconds, unitsPerHour, the bound and the per-setpoint times as JSON" };
        var command = new Command("dry-run", "Run a sequence on the simulator in accelerated time and predict the batch time") { sequence, fixture, units, json };
        command.SetAction(async (parse, ct) =>
        {
            var fixturePath = parse.GetValue(fixture) ?? ContentRoot.Resolve(context.Root, context.Options.Fixture);
            var fixtureResult = DefinitionFiles.LoadFixture(fixturePath, context.Error);
            if (!fixtureResult.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            var fx = fixtureResult.Value;
            var count = parse.GetValue(units) ?? fx.Slots.Count;
            if (count < 1 || count > fx.Slots.Count)
            {
                return context.BadInput($"--units must be between 1 and {fx.Slots.Count} (one batch in fixture '{fx.Id}'), not {count}");
            }

            var sequenceResult = DefinitionFiles.LoadSequence(parse.GetValue(sequence)!, fx, context.Error);
            if (!sequenceResult.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            if (Rig.Simulation.SimulatedUnitDesign.ForProduct(sequenceResult.Value.Product) is null)
            {
                return context.BadInput($"the simulator builds no '{sequenceResult.Value.Product}' units (it builds {string.Join(", ", Rig.Simulation.SimulatedUnitDesign.Demo.Select(d => d.Product))})");
            }

            var report = await DryRun.RunAsync(fx, sequenceResult.Value, sequenceResult.Sha256, count, context.Options.SimulatorSeed, ct).ConfigureAwait(false);
            if (parse.GetValue(json))
            {
                context.Output.WriteLine(JsonSerializer.Serialize(new
                {
                    batchSeconds = Math.Round(report.BatchSeconds, 1),
                    unitsPerHour = Math.Round(report.UnitsPerHour, 2),
                    boundBatchSeconds = Math.Round(report.Bound.BatchSeconds, 1),
                    boundUnitsPerHour = Math.Round(report.Bound.UnitsPerHour, 2),
                    units = report.Units,
                    mode = SequenceMode(sequenceResult.Value),
                    windowBoundBatchSeconds = Math.Round(report.WindowBound.BatchSeconds, 1),
                    windowBoundUnitsPerHour = Math.Round(report.WindowBound.UnitsPerHour, 2),
                    setpoints = report.Setpoints.Select(p => new
                    {
                        name = p.Setpoint,
                        celsius = p.Celsius,
                        startSeconds = Math.Round(p.StartSeconds, 1),
                        rampAndStableSeconds = Math.Round(p.RampAndStableSeconds, 1),
                        soakSeconds = Math.Round(p.SoakSeconds, 1),
                        measureSeconds = Math.Round(p.MeasureSeconds, 1),
                        mode = p.Mode,
                        fallbackReason = p.FallbackReason,
                    }),
                    aborted = report.Aborted,
                }));
            }
            else
            {
                Write(context.Output, report);
            }

            return report.Aborted is null ? ExitCodes.Done : ExitCodes.RuntimeFailure;
        });
        return command;
    }

    /// <summary>
    /// The settle mode of <paramref name="sequence"/>: <c>window</c> or <c>predictive</c> when every setpoint has it,
    /// <c>mixed</c> when setpoints differ.
    /// </summary>
    public static string SequenceMode(Core.Sequences.SequenceDefinition sequence)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        var modes = sequence.Setpoints.Select(s => Core.Sequences.SettleSettings.For(sequence, s.Name).Mode).Distinct(StringComparer.Ordinal).ToList();
        return modes.Count == 1 ? modes[0] : "mixed";
    }

    private static void Write(TextWriter o, DryRunReport r)
    {
        var inv = CultureInfo.InvariantCulture;
        o.WriteLine(string.Create(inv, $"Dry run: {r.Units} units, one batch, simulated"));
        o.WriteLine();
        o.WriteLine("setpoint        °C   starts at  ramp+stable     soak  measure  settled by");
        foreach (var p in r.Setpoints)
        {
            o.WriteLine(string.Create(inv, $"{p.Setpoint,-12} {p.Celsius,5:0.#}   {Minutes(p.StartSeconds),9}  {Minutes(p.RampAndStableSeconds),11}  {Minutes(p.SoakSeconds),7}  {Minutes(p.MeasureSeconds),7}  {p.Mode}"));
            if (p.FallbackReason is not null)
            {
                o.WriteLine($"  fell back: {p.FallbackReason}");
            }
        }

        o.WriteLine();
        o.WriteLine(string.Create(inv, $"Predicted batch time {Minutes(r.BatchSeconds)} ({r.BatchSeconds:F0} s): {r.UnitsPerHour:F1} units per hour"));
        o.WriteLine(string.Create(inv, $"Thermal lower bound  {Minutes(r.Bound.BatchSeconds)} ({r.Bound.BatchSeconds:F0} s): {r.Bound.UnitsPerHour:F1} units per hour ({(r.Bound.BatchSeconds / r.BatchSeconds * 100):F0} % of it reached)"));
        if (Math.Abs(r.WindowBound.BatchSeconds - r.Bound.BatchSeconds) > 1e-9)
        {
            o.WriteLine(string.Create(inv, $"Wait-for-stability bound {Minutes(r.WindowBound.BatchSeconds)} ({r.WindowBound.BatchSeconds:F0} s): {r.WindowBound.UnitsPerHour:F1} units per hour (the window mode's bound; predictive gives {r.UnitsPerHour / r.WindowBound.UnitsPerHour:F2} × it)"));
        }
        if (r.Aborted is not null)
        {
            o.WriteLine($"The batch did not complete: {r.Aborted}");
        }
    }

    private static string Minutes(double seconds) =>
        string.Create(CultureInfo.InvariantCulture, $"{(int)(seconds / 60)}:{(int)(seconds % 60):D2}");
}
