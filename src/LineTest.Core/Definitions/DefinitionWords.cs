using LineTest.Core.Decisions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Core.Definitions;

/// <summary>
/// The words a text key of a definition file may hold (a unit of measure, a rig, an output…), by the model property
/// that holds them: written into the JSON Schema as <c>enum</c>, so an editor flags <c>"unit": "ma"</c> as the
/// checkers do.
/// </summary>
public static class DefinitionWords
{
    /// <summary>The words of a model property, by its declaring type and C# name; null when it is free text.</summary>
    public static IReadOnlyList<string>? ForProperty(Type declaringType, string propertyName) =>
        ByProperty.TryGetValue((declaringType, propertyName), out var words) ? words : null;

    private static readonly Dictionary<(Type, string), IReadOnlyList<string>> ByProperty = new()
    {
        [(typeof(LimitSpec), nameof(LimitSpec.Unit))] = [.. UnitsOfMeasure.Symbols],
        [(typeof(FixtureDefinition), nameof(FixtureDefinition.Rig))] = ["simulator", "serial"],
        [(typeof(SourceDefinition), nameof(SourceDefinition.Kind))] = ["dry-block", "bath", "chamber"],
        [(typeof(ScannerDefinition), nameof(ScannerDefinition.Kind))] = ["keyboard", "serial"],
        [(typeof(ReferenceSensorDefinition), nameof(ReferenceSensorDefinition.Kind))] = Thermometry.ReferenceSensorFactory.Kinds,
        [(typeof(SequenceDefinition), nameof(SequenceDefinition.SetpointOrder))] = SetpointOrders.All,
        [(typeof(TrimDefinition), nameof(TrimDefinition.Method))] = TrimMethods.All,
        [(typeof(SoakSettings), nameof(SoakSettings.Output))] = UnitOutputs.All,
        [(typeof(MeasureStep), nameof(MeasureStep.Output))] = UnitOutputs.All,
        [(typeof(VerifyStep), nameof(VerifyStep.Output))] = UnitOutputs.All,
        [(typeof(Trims.ResistorTrimSpec), nameof(Trims.ResistorTrimSpec.Series))] = ["E12", "E24", "E48", "E96"],
    };
}
