using System.Globalization;
using LineTest.Core.Characterisation;
using LineTest.Core.Decisions;
using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;

namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// The <c>iv-sweep</c> step: reads at the settled setpoint; where the currents come from, that they are positive and
/// increasing and enough for the fit, the units of every limit, the bias current a temperature coefficient needs, and
/// (with a fixture) that the fixture has a source-measure unit wired to every slot that can carry the currents. Never
/// crossed by the planner. Time: each unit in turn, the reference before and after, and every current's readings.
/// </summary>
public sealed class IvSweepStepKind : StepKind<IvSweepStep>
{
    /// <summary>Most currents in one sweep: enough for any fit, few enough to keep the cycle time down.</summary>
    public const int MaxPoints = 50;

    /// <inheritdoc />
    public override string Word => "iv-sweep";

    /// <summary>The sequence-wide sweep setting: the nominal bias current, when given, is a positive number.</summary>
    public static void CheckSequence(SequenceDefinition sequence, ProblemList problems)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(problems);
        problems.AddIf(sequence.NominalBiasAmps is { } seqBias && !(seqBias > 0 && double.IsFinite(seqBias)), "$.nominalBiasAmps",
            "the nominal bias current must be a positive number of amperes");
    }

    /// <inheritdoc />
    protected override void Check(IvSweepStep step, StepCheckContext context)
    {
        var path = context.Path;
        var problems = context.Problems;
        context.RequireSettled(step.Setpoint);
        CheckCurrents(step, path, problems);
        problems.AddIf(step.Samples < 1, $"{path}.samples", $"samples must be 1 or more, not {step.Samples}");
        problems.AddIf(step.ComplianceVolts is { } compliance && !(compliance > 0 && double.IsFinite(compliance)), $"{path}.complianceVolts",
            "the compliance must be a positive number of volts");
        problems.AddIf(step.NominalBiasAmps is { } bias && !(bias > 0 && double.IsFinite(bias)), $"{path}.nominalBiasAmps",
            "the nominal bias current must be a positive number of amperes");
        CheckLimits(context, step.IdealityLimits, "n", StepCheckContext.RatioUnits);
        CheckLimits(context, step.Log10SaturationCurrentLimits, "log10Is", StepCheckContext.RatioUnits);
        CheckLimits(context, step.SeriesResistanceLimits, "rsOhms", StepCheckContext.ResistanceUnits);
        CheckLimits(context, step.MaxResidualLimits, "maxResidualMillivolts", StepCheckContext.VoltageUnits);
        CheckLimits(context, step.TemperatureCoefficientLimits, "tempco", StepCheckContext.SlopeUnits);
        CheckLimits(context, step.ZeroKelvinLimits, "zeroKelvinVolts", StepCheckContext.VoltageUnits);
        if (step.TemperatureCoefficientLimits is not null || step.ZeroKelvinLimits is not null)
        {
            var key = step.TemperatureCoefficientLimits is not null ? "tempco" : "zeroKelvinVolts";
            problems.AddIf(!context.SweptAt.Any(s => s != step.Setpoint), $"{path}.{key}",
                "a temperature coefficient needs an earlier iv-sweep step at another setpoint");
            problems.AddIf((step.NominalBiasAmps ?? context.Sequence.NominalBiasAmps) is null, $"{path}.{key}",
                "a temperature coefficient is reported at the nominal bias current: give nominalBiasAmps on the step or the sequence");
        }

        context.SweptAt.Add(step.Setpoint);
        if (context.Fixture is { } fixture)
        {
            CheckFixture(step, fixture, path, problems);
        }
    }

    /// <inheritdoc />
    protected override string? SetpointOf(IvSweepStep step) => step.Setpoint;

    /// <inheritdoc />
    protected override double EstimateSeconds(IvSweepStep step, StepTimeModel model) =>
        model.Units * (2 * model.ReferenceReadSeconds + step.SweepCurrents().Count * Math.Max(step.Samples, 1) * model.MeterReadSeconds);

    /// <inheritdoc />
    protected override string DoingText(IvSweepStep step) => $"sweeping the sensor at {step.Setpoint}";

    private static void CheckLimits(StepCheckContext context, LimitSpec? limits, string key, string[] units)
    {
        if (limits is not null)
        {
            context.CheckLimits(limits, $"{context.Path}.{key}", units);
        }
    }

    private static void CheckCurrents(IvSweepStep sweep, string path, ProblemList problems)
    {
        var range = sweep.FromAmps is not null || sweep.ToAmps is not null || sweep.Points is not null;
        if (sweep.CurrentsAmps is { } list)
        {
            problems.AddIf(range, path, "give either currentsAmps or fromAmps/toAmps/points, not both");
            problems.AddIf(list.Count < ShockleyFit.MinimumPoints, $"{path}.currentsAmps",
                $"the fit of I_s, n and R_s needs at least {ShockleyFit.MinimumPoints} currents, got {list.Count}");
            problems.AddIf(list.Count > MaxPoints, $"{path}.currentsAmps", $"at most {MaxPoints} currents per sweep, got {list.Count}");
            for (var k = 0; k < list.Count; k++)
            {
                if (!(list[k] > 0) || !double.IsFinite(list[k]))
                {
                    problems.Add($"{path}.currentsAmps[{k}]", $"the current must be a positive number of amperes, not {F(list[k])}");
                }
                else if (k > 0 && list[k] <= list[k - 1])
                {
                    problems.Add($"{path}.currentsAmps[{k}]", $"currents must increase: {F(list[k])} A is not above {F(list[k - 1])} A");
                }
            }

            return;
        }

        if (!range)
        {
            problems.Add(path, "give the sweep currents: currentsAmps, or fromAmps, toAmps and points");
            return;
        }

        problems.AddIf(sweep.FromAmps is not { } from || !(from > 0) || !double.IsFinite(from), $"{path}.fromAmps", "give the first current, a positive number of amperes");
        problems.AddIf(sweep.ToAmps is not { } to || !(to > 0) || !double.IsFinite(to), $"{path}.toAmps", "give the last current, a positive number of amperes");
        if (sweep.FromAmps is { } f && sweep.ToAmps is { } t && f > 0 && t > 0 && t <= f)
        {
            problems.Add($"{path}.toAmps", $"currents must increase: the last current ({F(t)} A) must be above the first ({F(f)} A)");
        }

        if (sweep.Points is not { } points)
        {
            problems.Add($"{path}.points", "give the number of currents of the range");
        }
        else if (points < ShockleyFit.MinimumPoints || points > MaxPoints)
        {
            problems.Add($"{path}.points", $"the number of currents must be {ShockleyFit.MinimumPoints} … {MaxPoints}, not {points}");
        }
    }

    private static void CheckFixture(IvSweepStep sweep, FixtureDefinition fixture, string path, ProblemList problems)
    {
        if (fixture.SourceMeter is not { } smu)
        {
            problems.Add(path, $"fixture '{fixture.Id}' has no source-measure unit ('sourceMeter') for an I–V sweep");
            return;
        }

        var unwired = fixture.Slots.Where(s => s.SmuChannel is null).Select(s => s.Slot.ToString(CultureInfo.InvariantCulture)).ToList();
        problems.AddIf(unwired.Count > 0, path, $"slot(s) {string.Join(", ", unwired)} of fixture '{fixture.Id}' have no smuChannel for an I–V sweep");
        var currents = sweep.SweepCurrents();
        if (currents.Count > 0 && currents.Max() > smu.MaxCurrentAmps)
        {
            problems.Add(sweep.CurrentsAmps is null ? $"{path}.toAmps" : $"{path}.currentsAmps",
                $"{F(currents.Max())} A is above the {F(smu.MaxCurrentAmps)} A fixture '{fixture.Id}' allows through a sensor");
        }
    }

    private static string F(double value) => value.ToString("G4", CultureInfo.InvariantCulture);
}
