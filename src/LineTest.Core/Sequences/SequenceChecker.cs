using LineTest.Core.Decisions;
using System.Globalization;
using System.Text.RegularExpressions;
using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Trims;

namespace LineTest.Core.Sequences;

/// <summary>
/// Checks that a parsed sequence makes sense, alone and against a fixture. Finds every problem, not only the
/// first, each at its JSON path.
/// </summary>
public static class SequenceChecker
{
    private static readonly string[] CurrentUnits = ["A", "mA", "uA"];
    private static readonly string[] VoltageUnits = ["V", "mV", "uV"];
    private static readonly string[] TemperatureDifferenceUnits = ["degC", "K"];
    private static readonly string[] CountUnits = ["count"];
    private static readonly string[] RatioUnits = ["1"];
    private static readonly string[] ResistanceUnits = ["ohm", "kohm"];
    private static readonly string[] SlopeUnits = ["mV/degC"];

    /// <summary>Checks <paramref name="sequence"/>; with a fixture, also that every setpoint is inside its safe range.</summary>
    public static ProblemList Check(SequenceDefinition sequence, FixtureDefinition? fixture)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        var problems = new ProblemList();
        problems.AddIf(string.IsNullOrWhiteSpace(sequence.Id), "$.id", "the id must not be empty");
        problems.AddIf(sequence.Revision < 1, "$.revision", $"the revision must be 1 or more, not {sequence.Revision}");
        problems.AddIf(string.IsNullOrWhiteSpace(sequence.Product), "$.product", "the product must not be empty");
        CheckSerialPattern(sequence.SerialPattern, problems);
        CheckStability(sequence.Stability, problems);
        CheckSoak(sequence.Soak, problems);
        var setpoints = CheckSetpoints(sequence.Setpoints, fixture, problems);
        CheckTrim(sequence.Trim, problems);
        CheckSoakSensitivity(sequence, problems);
        CheckSteps(sequence, setpoints, problems);
        IvSweepRules.Check(sequence, fixture, problems);
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
        Positive(s.BandC, "$.stability.bandC", problems);
        Positive(s.MaxDriftCPerMinute, "$.stability.maxDriftCPerMinute", problems);
        Positive(s.WindowSeconds, "$.stability.windowSeconds", problems);
        Positive(s.SampleIntervalSeconds, "$.stability.sampleIntervalSeconds", problems);
        Positive(s.TimeoutSeconds, "$.stability.timeoutSeconds", problems);

        // A zero or negative bound could never be met: every settle would run into its timeout.
        Positive(s.MaxOffsetFromSetpointC, "$.stability.maxOffsetFromSetpointC", problems);
        problems.AddIf(s.SampleIntervalSeconds > 0 && s.WindowSeconds > 0 && s.WindowSeconds < 2 * s.SampleIntervalSeconds,
            "$.stability.windowSeconds", "the window must hold at least three readings (two sample intervals or more)");
        problems.AddIf(s.TimeoutSeconds > 0 && s.TimeoutSeconds <= s.WindowSeconds,
            "$.stability.timeoutSeconds", "the timeout must be longer than the stability window");
    }

    private static void CheckSoak(SoakSettings s, ProblemList problems)
    {
        problems.AddIf(s.MinimumSeconds < 0, "$.soak.minimumSeconds", "the minimum soak cannot be negative");
        Positive(s.MaxDriftCPerMinute, "$.soak.maxDriftCPerMinute", problems);
        Positive(s.WindowSeconds, "$.soak.windowSeconds", problems);
        Positive(s.SampleIntervalSeconds, "$.soak.sampleIntervalSeconds", problems);
        Positive(s.TimeoutSeconds, "$.soak.timeoutSeconds", problems);
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
        problems.AddIf(setpoints.Count == 0, "$.setpoints", "at least one setpoint is needed");
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

            if (!double.IsFinite(sp.Celsius))
            {
                problems.Add($"{path}.celsius", "the temperature must be a finite number");
            }
            else if (fixture is not null && (sp.Celsius < fixture.Source.SafeMinC || sp.Celsius > fixture.Source.SafeMaxC))
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
                    CheckDac(trim.Dac, problems);
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

    /// <summary>
    /// A trim spec's own problems come as "relative.path: reason"; each is placed at its JSON path under
    /// <paramref name="root"/> so the engineer is taken to the offending key.
    /// </summary>
    private static void AddSpecProblems(IReadOnlyList<string> specProblems, string root, ProblemList problems)
    {
        foreach (var problem in specProblems)
        {
            var colon = problem.IndexOf(": ", StringComparison.Ordinal);
            if (colon > 0 && !problem[..colon].Contains(' ', StringComparison.Ordinal))
            {
                problems.Add($"{root}.{problem[..colon]}", problem[(colon + 2)..]);
            }
            else
            {
                problems.Add(root, problem);
            }
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

        problems.AddIf(soak.OutputVoltsPerC is { } sens && (sens == 0 || !double.IsFinite(sens)), "$.soak.outputVoltsPerC",
            "the output sensitivity must be a non-zero number");
        problems.AddIf(soak.OutputCountsPerC is { } counts && (counts == 0 || !double.IsFinite(counts)), "$.soak.outputCountsPerC",
            "the raw sensitivity must be a non-zero number");
    }

    /// <summary>Checks an <c>output</c> word; returns true when it is known.</summary>
    private static bool CheckOutput(string output, string path, ProblemList problems)
    {
        if (UnitOutputs.All.Contains(output, StringComparer.Ordinal))
        {
            return true;
        }

        problems.Add($"{path}.output", $"unknown output '{output}' (known: {string.Join(", ", UnitOutputs.All)})");
        return false;
    }

    private static void CheckDac(DacTrimSpec dac, ProblemList problems)
    {
        CheckDacChannel(dac.Gain, "$.trim.dac.gain", problems);
        CheckDacChannel(dac.Offset, "$.trim.dac.offset", problems);
        problems.AddIf(dac.Target.SlopeVoltsPerC == 0 || !double.IsFinite(dac.Target.SlopeVoltsPerC),
            "$.trim.dac.target.slopeVoltsPerC", "the target slope must be a non-zero number");
    }

    private static void CheckDacChannel(DacChannelSpec channel, string path, ProblemList problems)
    {
        problems.AddIf(channel.Min >= channel.Max, $"{path}.min", $"min ({channel.Min}) must be below max ({channel.Max})");
        problems.AddIf(channel.Nominal < channel.Min || channel.Nominal > channel.Max, $"{path}.nominal",
            $"nominal code {channel.Nominal} is outside {channel.Min} … {channel.Max}");
        problems.AddIf(channel.Step == 0 || !double.IsFinite(channel.Step), $"{path}.step", "the step must be a non-zero number");
        problems.AddIf(string.IsNullOrWhiteSpace(channel.Register), $"{path}.register", "the register name must not be empty");
    }

    private static void CheckSteps(SequenceDefinition sequence, HashSet<string> setpoints, ProblemList problems)
    {
        problems.AddIf(sequence.Steps.Count == 0, "$.steps", "at least one step is needed");
        string? settledAt = null;
        var measured = new HashSet<string>(StringComparer.Ordinal);
        var readingNames = new Dictionary<string, int>(StringComparer.Ordinal);
        var trimmed = false;
        var firmware = sequence.Trim?.Method == TrimMethods.Firmware;
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
                    problems.Add($"{path}.name", $"step name '{name}' is already used by step {first + 1}");
                }
                else
                {
                    readingNames[name] = i;
                }
            }

            switch (step)
            {
                case SettleStep settle:
                    // Remember even an unknown setpoint: the steps after it are then judged against what the engineer
                    // meant to settle at, so one misspelt name gives one problem, not one per following step.
                    RequireSetpoint(settle.Setpoint, setpoints, $"{path}.setpoint", problems);
                    settledAt = settle.Setpoint;
                    break;
                case MeasureStep measure:
                    RequireSettled(measure.Setpoint, settledAt, setpoints, path, problems);
                    Samples(measure.Samples, path, problems);
                    var measureOutputKnown = CheckOutput(measure.Output, path, problems);
                    problems.AddIf(measureOutputKnown && firmware && measure.Output != UnitOutputs.Link, $"{path}.output",
                        "a firmware trim is computed from the unit's raw counts: read them with \"output\": \"link\"");
                    if (measure.OutputLimits is { } outputLimits)
                    {
                        CheckLimits(outputLimits, $"{path}.outputLimits", measure.Output == UnitOutputs.Link ? CountUnits : VoltageUnits, problems);
                    }

                    measured.Add(measure.Setpoint);
                    break;
                case VerifyStep verify:
                    RequireSettled(verify.Setpoint, settledAt, setpoints, path, problems);
                    Samples(verify.Samples, path, problems);
                    var verifyOutputKnown = CheckOutput(verify.Output, path, problems);
                    problems.AddIf(verifyOutputKnown && firmware && verify.Output != UnitOutputs.Link, $"{path}.output",
                        "a firmware-trimmed unit reports its temperature itself: verify it with \"output\": \"link\"");
                    CheckLimits(verify.Limits, $"{path}.limits", TemperatureDifferenceUnits, problems);
                    problems.AddIf(sequence.Trim is not null && !trimmed, path,
                        "a verify step must come after the trim step (it confirms the trim)");
                    break;
                case SupplyCurrentStep supply:
                    Samples(supply.Samples, path, problems);
                    CheckLimits(supply.Limits, $"{path}.limits", CurrentUnits, problems);
                    break;
                case TrimStep trim:
                    trimmed = true;
                    CheckTrimStep(sequence, trim, path, setpoints, measured, problems);
                    break;
                case PromptStep prompt:
                    problems.AddIf(string.IsNullOrWhiteSpace(prompt.Text), $"{path}.text", "the prompt text must not be empty");
                    break;
                case IvSweepStep sweep:
                    RequireSettled(sweep.Setpoint, settledAt, setpoints, path, problems);
                    break;
                case IdentifyStep:
                    break;
                default:
                    problems.Add($"{path}.kind", $"step kind '{step.Kind}' is not supported by this checker");
                    break;
            }
        }
    }

    private static void CheckTrimStep(
        SequenceDefinition sequence, TrimStep trim, string path, HashSet<string> setpoints, HashSet<string> measured, ProblemList problems)
    {
        problems.AddIf(sequence.Trim is null, path, "a trim step needs the sequence's 'trim' object (method and parameters)");
        problems.AddIf(trim.Points.Count < 2, $"{path}.points", "a trim needs calibration points from two setpoints or more");
        var distinct = new HashSet<string>(StringComparer.Ordinal);
        for (var p = 0; p < trim.Points.Count; p++)
        {
            var point = trim.Points[p];
            var pointPath = $"{path}.points[{p}]";
            if (RequireSetpoint(point, setpoints, pointPath, problems))
            {
                problems.AddIf(!measured.Contains(point), pointPath,
                    $"setpoint '{point}' has no measure step before this trim step");
                problems.AddIf(!distinct.Add(point), pointPath, $"setpoint '{point}' is listed twice");
            }
        }

        for (var p = 0; p < trim.PredictAt.Count; p++)
        {
            RequireSetpoint(trim.PredictAt[p], setpoints, $"{path}.predictAt[{p}]", problems);
        }
    }

    private static bool RequireSetpoint(string name, HashSet<string> setpoints, string path, ProblemList problems)
    {
        if (setpoints.Contains(name))
        {
            return true;
        }

        var known = setpoints.Count == 0 ? "none defined" : string.Join(", ", setpoints.Order(StringComparer.Ordinal));
        problems.Add(path, $"setpoint '{name}' does not exist (known: {known})");
        return false;
    }

    private static void RequireSettled(string setpoint, string? settledAt, HashSet<string> setpoints, string path, ProblemList problems)
    {
        var settledAtKnown = settledAt is null || setpoints.Contains(settledAt);
        if (RequireSetpoint(setpoint, setpoints, $"{path}.setpoint", problems) && settledAtKnown && settledAt != setpoint)
        {
            problems.Add($"{path}.setpoint",
                settledAt is null
                    ? $"no settle step brings the source to '{setpoint}' before this step"
                    : $"the source is settled at '{settledAt}' here, not at '{setpoint}'");
        }
    }

    private static void Samples(int samples, string path, ProblemList problems) =>
        problems.AddIf(samples < 1, $"{path}.samples", $"samples must be 1 or more, not {samples}");

    /// <summary>Limits of an I–V sweep reading, by their JSON key: which units fit.</summary>
    internal static void CheckSweepLimits(LimitSpec? limits, string path, string key, ProblemList problems)
    {
        if (limits is null)
        {
            return;
        }

        var units = key switch
        {
            "n" or "log10Is" => RatioUnits,
            "rsOhms" => ResistanceUnits,
            "tempco" => SlopeUnits,
            _ => VoltageUnits,
        };
        CheckLimits(limits, $"{path}.{key}", units, problems);
    }

    private static void CheckLimits(LimitSpec limits, string path, string[] allowedUnits, ProblemList problems)
    {
        if (!UnitsOfMeasure.IsKnown(limits.Unit))
        {
            problems.Add($"{path}.unit",
                $"unknown unit of measure '{limits.Unit}' (known: {string.Join(", ", UnitsOfMeasure.Symbols)})");
        }
        else if (!allowedUnits.Contains(limits.Unit, StringComparer.Ordinal))
        {
            problems.Add($"{path}.unit", $"unit '{limits.Unit}' does not fit this reading (use {string.Join(", ", allowedUnits)})");
        }

        problems.AddIf(limits.Low is null && limits.High is null, path, "give a low limit, a high limit or both");
        problems.AddIf(limits.Low is { } lo && !double.IsFinite(lo), $"{path}.low", "the low limit must be a finite number");
        problems.AddIf(limits.High is { } hi && !double.IsFinite(hi), $"{path}.high", "the high limit must be a finite number");
        if (limits.Low is { } low && limits.High is { } high && low > high)
        {
            problems.Add($"{path}.low", $"the low limit ({F(low)}) is above the high limit ({F(high)})");
        }

        problems.AddIf(limits.GuardBandFactor < 0 || !double.IsFinite(limits.GuardBandFactor), $"{path}.guardBandFactor",
            "the guard-band factor must be zero or more");
    }

    private static void Positive(double value, string path, ProblemList problems) =>
        problems.AddIf(!(value > 0) || !double.IsFinite(value), path,
            double.IsFinite(value) ? $"must be a positive number, not {F(value)}" : "must be a positive number within range (this one overflows)");

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
