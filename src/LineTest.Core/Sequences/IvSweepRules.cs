using System.Globalization;
using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Characterisation;

namespace LineTest.Core.Sequences;

/// <summary>
/// The checker's rules for <see cref="IvSweepStep"/>: where the currents come from, that they are positive and
/// increasing and enough for the fit, the units of every limit, the bias current a temperature coefficient needs,
/// and (with a fixture) that the fixture has a source-measure unit wired to every slot that can carry the currents.
/// The setpoint-settled rule is checked with the other steps in <see cref="SequenceChecker"/>.
/// </summary>
internal static class IvSweepRules
{
    /// <summary>Most currents in one sweep: enough for any fit, few enough to keep the cycle time down.</summary>
    public const int MaxPoints = 50;

    public static void Check(SequenceDefinition sequence, FixtureDefinition? fixture, ProblemList problems)
    {
        problems.AddIf(sequence.NominalBiasAmps is { } seqBias && !(seqBias > 0 && double.IsFinite(seqBias)), "$.nominalBiasAmps",
            "the nominal bias current must be a positive number of amperes");
        var sweptAt = new List<string>();
        for (var i = 0; i < sequence.Steps.Count; i++)
        {
            if (sequence.Steps[i] is not IvSweepStep sweep)
            {
                continue;
            }

            var path = $"$.steps[{i}]";
            CheckCurrents(sweep, path, problems);
            DefinitionBounds.Samples.Check(sweep.Samples, $"{path}.samples", problems);
            problems.AddIf(sweep.ComplianceVolts is { } compliance && !(compliance > 0 && double.IsFinite(compliance)), $"{path}.complianceVolts",
                "the compliance must be a positive number of volts");
            problems.AddIf(sweep.NominalBiasAmps is { } bias && !(bias > 0 && double.IsFinite(bias)), $"{path}.nominalBiasAmps",
                "the nominal bias current must be a positive number of amperes");
            SequenceChecker.CheckSweepLimits(sweep.IdealityLimits, path, "n", problems);
            SequenceChecker.CheckSweepLimits(sweep.Log10SaturationCurrentLimits, path, "log10Is", problems);
            SequenceChecker.CheckSweepLimits(sweep.SeriesResistanceLimits, path, "rsOhms", problems);
            SequenceChecker.CheckSweepLimits(sweep.MaxResidualLimits, path, "maxResidualMillivolts", problems);
            SequenceChecker.CheckSweepLimits(sweep.TemperatureCoefficientLimits, path, "tempco", problems);
            SequenceChecker.CheckSweepLimits(sweep.ZeroKelvinLimits, path, "zeroKelvinVolts", problems);
            if (sweep.TemperatureCoefficientLimits is not null || sweep.ZeroKelvinLimits is not null)
            {
                var key = sweep.TemperatureCoefficientLimits is not null ? "tempco" : "zeroKelvinVolts";
                problems.AddIf(!sweptAt.Any(s => s != sweep.Setpoint), $"{path}.{key}",
                    "a temperature coefficient needs an earlier iv-sweep step at another setpoint");
                problems.AddIf((sweep.NominalBiasAmps ?? sequence.NominalBiasAmps) is null, $"{path}.{key}",
                    "a temperature coefficient is reported at the nominal bias current: give nominalBiasAmps on the step or the sequence");
            }

            sweptAt.Add(sweep.Setpoint);
            if (fixture is not null)
            {
                CheckFixture(sweep, fixture, path, problems);
            }
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
                if (!DefinitionBounds.SensorCurrentAmps.Check(list[k], $"{path}.currentsAmps[{k}]", problems))
                {
                    continue;
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

        problems.AddIf(sweep.FromAmps is null, $"{path}.fromAmps", "give the first current, a positive number of amperes");
        problems.AddIf(sweep.ToAmps is null, $"{path}.toAmps", "give the last current, a positive number of amperes");
        DefinitionBounds.SensorCurrentAmps.Check(sweep.FromAmps, $"{path}.fromAmps", problems);
        DefinitionBounds.SensorCurrentAmps.Check(sweep.ToAmps, $"{path}.toAmps", problems);
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
        // The largest current without building the sweep: a range ends at toAmps (a points count far out of bounds must
        // not allocate before its own problem is reported).
        var largest = sweep.CurrentsAmps is { Count: > 0 } list ? list.Max() : sweep.ToAmps;
        if (largest is { } max && max > smu.MaxCurrentAmps)
        {
            problems.Add(sweep.CurrentsAmps is null ? $"{path}.toAmps" : $"{path}.currentsAmps",
                $"{F(max)} A is above the {F(smu.MaxCurrentAmps)} A fixture '{fixture.Id}' allows through a sensor");
        }
    }

    private static string F(double value) => value.ToString("G4", CultureInfo.InvariantCulture);
}
