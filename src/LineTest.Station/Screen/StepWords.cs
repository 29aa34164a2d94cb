using System.Globalization;
using LineTest.Core.Sequences;
using LineTest.Core.Units;

namespace LineTest.Station.Screen;

/// <summary>
/// What a unit is doing, in words an operator understands and short enough for the table's "Doing" column
/// (at most <see cref="Width"/> characters): "block to -20 °C", "reading at 40 °C", "checking at 5 °C". Steps at a
/// setpoint are named by its temperature (what the operator sees on the block); other steps by the step kind's
/// descriptor (<c>Core/Sequences/Steps</c>) when its words fit, else by the unit's state.
/// </summary>
public sealed class StepWords
{
    /// <summary>The width of the "Doing" column.</summary>
    public const int Width = 18;

    private readonly Dictionary<string, StepDefinition> _steps;
    private readonly Dictionary<string, double> _setpoints;

    /// <summary>Words for the steps of <paramref name="sequence"/>.</summary>
    public StepWords(SequenceDefinition sequence)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        _steps = sequence.Steps.GroupBy(s => s.DisplayName, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.First(), StringComparer.Ordinal);
        _setpoints = sequence.Setpoints.GroupBy(s => s.Name, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.First().Celsius, StringComparer.Ordinal);
    }

    /// <summary>The words for a unit in <paramref name="state"/> at the step named <paramref name="step"/>, the block heading for <paramref name="setpointC"/>.</summary>
    public string Of(UnitState state, string step, double? setpointC)
    {
        _steps.TryGetValue(step, out var definition);
        var at = At(definition, setpointC);
        var words = state switch
        {
            UnitState.CheckingSupply => "supply current",
            UnitState.WaitingForSource => "block to" + at,
            UnitState.Soaking => "soaking at" + at,
            UnitState.Measuring when definition is IvSweepStep => "I-V sweep at" + at,
            UnitState.Measuring => "reading at" + at,
            UnitState.Verifying => "checking at" + at,
            UnitState.Trimming when definition is TrimStep => "trimming",
            _ => StateWords.Of(state),
        };
        if (words == StateWords.Of(state) && definition is not null
            && LineTest.Core.Sequences.Steps.StepKinds.Find(definition)?.DoingText(definition) is { Length: > 0 and <= Width } described)
        {
            // No temperature to name: the step kind's own words, when they fit the column.
            return described;
        }

        return words.Length <= Width ? words : StateWords.Of(state);
    }

    private string At(StepDefinition? step, double? setpointC)
    {
        var name = step switch
        {
            MeasureStep m => m.Setpoint,
            VerifyStep v => v.Setpoint,
            IvSweepStep i => i.Setpoint,
            _ => null,
        };
        double? celsius = name is not null && _setpoints.TryGetValue(name, out var c) ? c : setpointC;
        return celsius is { } t ? string.Create(CultureInfo.InvariantCulture, $" {t:0.#} °C") : string.Empty;
    }
}
