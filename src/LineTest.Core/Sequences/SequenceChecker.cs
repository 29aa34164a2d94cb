using LineTest.Core.Decisions;
using System.Globalization;
using System.Text.RegularExpressions;
using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences.Steps;
using LineTest.Core.Trims;

namespace LineTest.Core.Sequences;

/// <summary>
/// Checks that a parsed sequence makes sense, alone and against a fixture. Finds every problem, not only the
/// first, each at its JSON path.
/// </summary>
public static class SequenceChecker
{
    /// <summary>Checks <paramref name="sequence"/>; with a fixture, also that every setpoint is inside its safe range.</summary>
    public static ProblemList Check(SequenceDefinition sequence, FixtureDefinition? fixture)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        var problems = new ProblemList();
        problems.AddIf(string.IsNullOrWhiteSpace(sequence.Id), "$.id", "the id must not be empty");
        DefinitionBounds.Revision.Check(sequence.Revision, "$.revision", problems);
        problems.AddIf(string.IsNullOrWhiteSpace(sequence.Product), "$.product", "the product must not be empty");
        CheckSerialPattern(sequence.SerialPattern, problems);
        CheckStability(sequence.Stability, problems);
        CheckSoak(sequence.Soak, problems);
        var setpoints = CheckSetpoints(sequence.Setpoints, fixture, problems);
        CheckTrim(sequence.Trim, problems);
        CheckSoakSensitivity(sequence, problems);
        CheckSteps(sequence, fixture, setpoints, problems);
        IvSweepStepKind.CheckSequence(sequence, problems);
        DispositionRules.Check(sequence, problems);
        SettleRules.Check(sequence, problems);
        AccuracyRules.Check(sequence, problems);
        problems.AddIf(!SetpointOrders.All.Contains(sequence.SetpointOrder, StringComparer.Ordinal), "$.setpointOrder",
            $"'{sequence.SetpointOrder}' is not a setpoint order: use {string.Join(" or ", SetpointOrders.All.Select(o => $"\"{o}\""))}");
        return problems;
    }

    private static void CheckSerialPattern(string pattern, ProblemList problems)
    {
        if (string.IsNullOrWhiteSpace(pattern))
        {
            problems.Add("$.serialPattern", "the serial pattern must not be empty");
            return;
        }

        try
        {
            _ = new Regex(pattern, RegexOptions.None, TimeSpan.FromSeconds(1));
        }
        catch (ArgumentException ex)
        {
            problems.Add("$.serialPattern", $"not a valid regular expression: {ex.Message}");
        }
    }

    private static void CheckStability(StabilitySettings s, ProblemList problems)
    {
        DefinitionBounds.TemperatureBandC.Check(s.BandC, "$.stability.bandC", problems);
        DefinitionBounds.DriftCPerMinute.Check(s.MaxDriftCPerMinute, "$.stability.maxDriftCPerMinute", problems);
        DefinitionBounds.WindowSeconds.Check(s.WindowSeconds, "$.stability.windowSeconds", problems);
        DefinitionBounds.SampleIntervalSeconds.Check(s.SampleIntervalSeconds, "$.stability.sampleIntervalSeconds", problems);
        DefinitionBounds.TimeoutSeconds.Check(s.TimeoutSeconds, "$.stability.timeoutSeconds", problems);

        // A zero or negative bound could never be met: every settle would run into its timeout.
        DefinitionBounds.TemperatureBandC.Check(s.MaxOffsetFromSetpointC, "$.stability.maxOffsetFromSetpointC", problems);
        problems.AddIf(s.SampleIntervalSeconds > 0 && s.WindowSeconds > 0 && s.WindowSeconds < 2 * s.SampleIntervalSeconds,
            "$.stability.windowSeconds", "the window must hold at least three readings (two sample intervals or more)");
        problems.AddIf(s.TimeoutSeconds > 0 && s.TimeoutSeconds <= s.WindowSeconds,
            "$.stability.timeoutSeconds", "the timeout must be longer than the stability window");
    }

    private static void CheckSoak(SoakSettings s, ProblemList problems)
    {
        DefinitionBounds.MinimumSoakSeconds.Check(s.MinimumSeconds, "$.soak.minimumSeconds", problems);
        DefinitionBounds.DriftCPerMinute.Check(s.MaxDriftCPerMinute, "$.soak.maxDriftCPerMinute", problems);
        DefinitionBounds.WindowSeconds.Check(s.WindowSeconds, "$.soak.windowSeconds", problems);
        DefinitionBounds.SampleIntervalSeconds.Check(s.SampleIntervalSeconds, "$.soak.sampleIntervalSeconds", problems);
        DefinitionBounds.TimeoutSeconds.Check(s.TimeoutSeconds, "$.soak.timeoutSeconds", problems);
        problems.AddIf(s.SampleIntervalSeconds > 0 && s.WindowSeconds > 0 && s.WindowSeconds < 2 * s.SampleIntervalSeconds,
            "$.soak.windowSeconds", "the window must hold at least three readings (two sample intervals or more)");
        // The drift window starts once the minimum soak is over (the unit is still far from the block before), so
        // the earliest a soak can end is the minimum plus the window; a shorter timeout errors every unit.
        problems.AddIf(s.TimeoutSeconds > 0 && s.MinimumSeconds >= 0 && s.WindowSeconds > 0 && s.TimeoutSeconds < s.MinimumSeconds + s.WindowSeconds,
            "$.soak.timeoutSeconds",
            $"the timeout ({F(s.TimeoutSeconds)} s) must be at least the minimum soak plus the window ({F(s.MinimumSeconds + s.WindowSeconds)} s)");
    }

    private static HashSet<string> CheckSetpoints(IReadOnlyList<SetpointDefinition> setpoints, FixtureDefinition? fixture, ProblemList problems)
    {
        var names = new HashSet<string>(StringComparer.Ordinal);
        problems.AddIf(!DefinitionBounds.SetpointCount.Admits(setpoints.Count), "$.setpoints",
            $"a sequence needs {DefinitionBounds.SetpointCount.Describe()} setpoints, not {setpoints.Count}");
        for (var i = 0; i < setpoints.Count; i++)
        {
            var sp = setpoints[i];
            var path = $"$.setpoints[{i}]";
            if (string.IsNullOrWhiteSpace(sp.Name))
            {
                problems.Add($"{path}.name", "the setpoint name must not be empty");
            }
            else if (!names.Add(sp.Name))
            {
                problems.Add($"{path}.name", $"setpoint '{sp.Name}' is defined twice");
            }

            // Judged against the fixture once it is a usable temperature.
            if (DefinitionBounds.TemperatureC.Check(sp.Celsius, $"{path}.celsius", problems) && fixture is not null && (sp.Celsius < fixture.Source.SafeMinC || sp.Celsius > fixture.Source.SafeMaxC))
            {
                problems.Add($"{path}.celsius",
                    $"{F(sp.Celsius)} °C is outside the safe range of fixture '{fixture.Id}' ({F(fixture.Source.SafeMinC)} … {F(fixture.Source.SafeMaxC)} °C)");
            }
        }

        return names;
    }

    private static void CheckTrim(TrimDefinition? trim, ProblemList problems)
    {
        if (trim is null)
        {
            return;
        }

        switch (trim.Method)
        {
            case TrimMethods.Dac:
                if (trim.Dac is null)
                {
                    problems.Add("$.trim", "method 'dac' needs a 'dac' object with gain, offset and target");
                }
                else
                {
                    AddSpecProblems(trim.Dac.Check(), "$.trim.dac", problems);
                }

                break;
            case TrimMethods.Resistor:
                if (trim.Resistor is null)
                {
                    problems.Add("$.trim", "method 'resistor' needs a 'resistor' object with series, tolerancePercent, gain, offset and target");
                }
                else
                {
                    AddSpecProblems(trim.Resistor.Check(), "$.trim.resistor", problems);
                }

                break;
            case TrimMethods.Firmware:
                if (trim.Firmware is null)
                {
                    problems.Add("$.trim", "method 'firmware' needs a 'firmware' object with order and coefficients");
                }
                else
                {
                    AddSpecProblems(trim.Firmware.Check(), "$.trim.firmware", problems);
                }

                break;
            default:
                problems.Add("$.trim.method", $"unknown trim method '{trim.Method}' (known: {string.Join(", ", TrimMethods.All)})");
                break;
        }

        var others = new (string Method, object? Spec)[] { (TrimMethods.Dac, trim.Dac), (TrimMethods.Resistor, trim.Resistor), (TrimMethods.Firmware, trim.Firmware) };
        foreach (var (method, spec) in others)
        {
            problems.AddIf(spec is not null && method != trim.Method && TrimMethods.All.Contains(trim.Method), $"$.trim.{method}",
                $"a '{method}' object does not belong to method '{trim.Method}': remove it or change the method");
        }
    }

    /// <summary>A trim spec's own problems, each placed at its JSON path under <paramref name="root"/>.</summary>
    private static void AddSpecProblems(IReadOnlyList<SpecProblem> specProblems, string root, ProblemList problems)
    {
        foreach (var problem in specProblems)
        {
            problems.Add(problem.Path.Length == 0 ? root : $"{root}.{problem.Path}", problem.Reason);
        }
    }

    private static void CheckSoakSensitivity(SequenceDefinition sequence, ProblemList problems)
    {
        var soak = sequence.Soak;
        if (!UnitOutputs.All.Contains(soak.Output, StringComparer.Ordinal))
        {
            problems.Add("$.soak.output", $"unknown output '{soak.Output}' (known: {string.Join(", ", UnitOutputs.All)})");
            return;
        }

        if (soak.Output == UnitOutputs.Link)
        {
            problems.AddIf(soak.OutputCountsPerC is null, "$.soak",
                "give soak.outputCountsPerC (the unit's raw sensitivity, counts per °C) so the soak can judge the unit's drift in °C over its link");
        }
        else
        {
            // Any analog target the trim object carries will do: a misspelt method is reported once, at the method.
            var target = sequence.Trim?.Dac?.Target ?? sequence.Trim?.Resistor?.Target;
            problems.AddIf(soak.OutputVoltsPerC is null && target is null, "$.soak",
                "give soak.outputVoltsPerC (the unit's output sensitivity) so the soak can judge the unit's drift in °C");
        }

        var most = NumberBound.F(DefinitionBounds.SensitivityMagnitude.Maximum);
        problems.AddIf(soak.OutputVoltsPerC is { } sens && !DefinitionBounds.SensitivityMagnitude.Admits(Math.Abs(sens)), "$.soak.outputVoltsPerC",
            $"the output sensitivity must be a number other than 0, at most {most} either way");
        problems.AddIf(soak.OutputCountsPerC is { } counts && !DefinitionBounds.SensitivityMagnitude.Admits(Math.Abs(counts)), "$.soak.outputCountsPerC",
            $"the raw sensitivity must be a number other than 0, at most {most} either way");
    }

    private static void CheckSteps(SequenceDefinition sequence, FixtureDefinition? fixture, HashSet<string> setpoints, ProblemList problems)
    {
        if (!DefinitionBounds.StepCount.Admits(sequence.Steps.Count))
        {
            problems.Add("$.steps", $"a sequence needs {DefinitionBounds.StepCount.Describe()} steps, not {sequence.Steps.Count}");
        }

        var context = new StepCheckContext(sequence, fixture, setpoints, problems);
        var readingNames = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < sequence.Steps.Count; i++)
        {
            var step = sequence.Steps[i];
            var path = $"$.steps[{i}]";
            if (step.Name is { } name)
            {
                if (string.IsNullOrWhiteSpace(name))
                {
                    problems.Add($"{path}.name", "the step name must not be empty when given");
                }
                else if (readingNames.TryGetValue(name, out var first))
                {
                    problems.Add($"{path}.name", $"step name '{name}' is already used at $.steps[{first}].name");
                }
                else
                {
                    readingNames[name] = i;
                }
            }

            // Each kind checks itself (Sequences/Steps); the context carries what the steps before it did.
            context.Path = path;
            if (StepKinds.Find(step) is { } kind)
            {
                kind.Check(step, context);
            }
            else
            {
                problems.Add($"{path}.kind", $"step kind '{step.Kind}' is not supported by this checker");
            }
        }
    }

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
