using System.Globalization;
using LineTest.Core.Decisions;
using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;

namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// What a step kind's check sees while the checker walks a sequence's steps in file order: the sequence, the fixture
/// (or null), the problems found so far, the current step's JSON path, and what the steps before it did (where the
/// source is settled, which setpoints were measured and swept, whether a trim has run). The shared rules (a setpoint
/// exists, the source is settled at it, limits have a unit of the reading's dimension) live here.
/// </summary>
public sealed class StepCheckContext
{
    /// <summary>Units of a current.</summary>
    public static readonly string[] CurrentUnits = ["A", "mA", "uA"];

    /// <summary>Units of a voltage.</summary>
    public static readonly string[] VoltageUnits = ["V", "mV", "uV"];

    /// <summary>Units of a temperature difference.</summary>
    public static readonly string[] TemperatureDifferenceUnits = ["degC", "K"];

    /// <summary>Units of a raw ADC reading.</summary>
    public static readonly string[] CountUnits = ["count"];

    /// <summary>Units of a dimensionless number.</summary>
    public static readonly string[] RatioUnits = ["1"];

    /// <summary>Units of a resistance.</summary>
    public static readonly string[] ResistanceUnits = ["ohm", "kohm"];

    /// <summary>Units of a voltage temperature coefficient.</summary>
    public static readonly string[] SlopeUnits = ["mV/degC"];

    /// <summary>Starts a walk over <paramref name="sequence"/>'s steps.</summary>
    public StepCheckContext(SequenceDefinition sequence, FixtureDefinition? fixture, IReadOnlySet<string> setpoints, ProblemList problems)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(setpoints);
        ArgumentNullException.ThrowIfNull(problems);
        Sequence = sequence;
        Fixture = fixture;
        Setpoints = setpoints;
        Problems = problems;
    }

    /// <summary>The sequence being checked.</summary>
    public SequenceDefinition Sequence { get; }

    /// <summary>The fixture it is checked against, or null.</summary>
    public FixtureDefinition? Fixture { get; }

    /// <summary>The names of the sequence's setpoints.</summary>
    public IReadOnlySet<string> Setpoints { get; }

    /// <summary>Where problems go.</summary>
    public ProblemList Problems { get; }

    /// <summary>The JSON path of the step being checked, e.g. <c>$.steps[3]</c>.</summary>
    public string Path { get; internal set; } = "$.steps";

    /// <summary>
    /// The setpoint the last settle step brought the source to (even an unknown one: the steps after it are then judged
    /// against what the engineer meant to settle at, so one misspelt name gives one problem, not one per step).
    /// </summary>
    public string? SettledAt { get; set; }

    /// <summary>Setpoints with a measure step so far.</summary>
    public HashSet<string> Measured { get; } = new(StringComparer.Ordinal);

    /// <summary>Setpoints of the iv-sweep steps so far, in order.</summary>
    public List<string> SweptAt { get; } = [];

    /// <summary>Whether a trim step came before this step.</summary>
    public bool Trimmed { get; set; }

    /// <summary>Whether the sequence trims with the firmware method (its measure and verify steps must read over the link).</summary>
    public bool FirmwareTrim => Sequence.Trim?.Method == TrimMethods.Firmware;

    /// <summary>True when <paramref name="name"/> is a setpoint of the sequence; otherwise adds a problem at <paramref name="path"/>.</summary>
    public bool RequireSetpoint(string name, string path)
    {
        if (Setpoints.Contains(name))
        {
            return true;
        }

        var known = Setpoints.Count == 0 ? "none defined" : string.Join(", ", Setpoints.Order(StringComparer.Ordinal));
        Problems.Add(path, $"setpoint '{name}' does not exist (known: {known})");
        return false;
    }

    /// <summary>The step reads at <paramref name="setpoint"/>: it must exist and be where the source was last settled.</summary>
    public void RequireSettled(string setpoint)
    {
        var settledAtKnown = SettledAt is null || Setpoints.Contains(SettledAt);
        if (RequireSetpoint(setpoint, $"{Path}.setpoint") && settledAtKnown && SettledAt != setpoint)
        {
            Problems.Add($"{Path}.setpoint",
                SettledAt is null
                    ? $"no settle step brings the source to '{setpoint}' before this step"
                    : $"the source is settled at '{SettledAt}' here, not at '{setpoint}'");
        }
    }

    /// <summary>At least one sample.</summary>
    public void RequireSamples(int samples) =>
        Problems.AddIf(samples < 1, $"{Path}.samples", $"samples must be 1 or more, not {samples}");

    /// <summary>Checks an <c>output</c> word; returns true when it is known.</summary>
    public bool CheckOutput(string output)
    {
        if (UnitOutputs.All.Contains(output, StringComparer.Ordinal))
        {
            return true;
        }

        Problems.Add($"{Path}.output", $"unknown output '{output}' (known: {string.Join(", ", UnitOutputs.All)})");
        return false;
    }

    /// <summary>Limits at <paramref name="path"/>: a known unit among <paramref name="allowedUnits"/>, finite and ordered bounds.</summary>
    public void CheckLimits(LimitSpec limits, string path, string[] allowedUnits)
    {
        ArgumentNullException.ThrowIfNull(limits);
        ArgumentNullException.ThrowIfNull(allowedUnits);
        if (!UnitsOfMeasure.IsKnown(limits.Unit))
        {
            Problems.Add($"{path}.unit",
                $"unknown unit of measure '{limits.Unit}' (known: {string.Join(", ", UnitsOfMeasure.Symbols)})");
        }
        else if (!allowedUnits.Contains(limits.Unit, StringComparer.Ordinal))
        {
            Problems.Add($"{path}.unit", $"unit '{limits.Unit}' does not fit this reading (use {string.Join(", ", allowedUnits)})");
        }

        Problems.AddIf(limits.Low is null && limits.High is null, path, "give a low limit, a high limit or both");
        Problems.AddIf(limits.Low is { } lo && !double.IsFinite(lo), $"{path}.low", "the low limit must be a finite number");
        Problems.AddIf(limits.High is { } hi && !double.IsFinite(hi), $"{path}.high", "the high limit must be a finite number");
        if (limits.Low is { } low && limits.High is { } high && low > high)
        {
            Problems.Add($"{path}.low", $"the low limit ({F(low)}) is above the high limit ({F(high)})");
        }

        Problems.AddIf(limits.GuardBandFactor < 0 || !double.IsFinite(limits.GuardBandFactor), $"{path}.guardBandFactor",
            "the guard-band factor must be zero or more");
    }

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
