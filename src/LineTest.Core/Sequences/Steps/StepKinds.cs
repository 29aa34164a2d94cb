namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// Every step kind's descriptor, one per <c>[JsonDerivedType]</c> of <see cref="StepDefinition"/> (a test holds the
/// two lists together). Adding a step kind: its record, its <c>[JsonDerivedType]</c> line, its descriptor here, and its
/// executor in the runtime (see DEVELOPERS.md).
/// </summary>
public static class StepKinds
{
    private static readonly IStepKind[] Kinds =
    [
        new IdentifyStepKind(),
        new SupplyCurrentStepKind(),
        new SettleStepKind(),
        new MeasureStepKind(),
        new TrimStepKind(),
        new VerifyStepKind(),
        new PromptStepKind(),
        new IvSweepStepKind(),
    ];

    private static readonly Dictionary<Type, IStepKind> ByType = Kinds.ToDictionary(k => k.StepType);

    /// <summary>Every registered descriptor.</summary>
    public static IReadOnlyList<IStepKind> All => Kinds;

    /// <summary>The descriptor of <paramref name="step"/>'s kind, or null for a kind nobody registered.</summary>
    public static IStepKind? Find(StepDefinition step)
    {
        ArgumentNullException.ThrowIfNull(step);
        return ByType.GetValueOrDefault(step.GetType());
    }

    /// <summary>The descriptor of <paramref name="step"/>'s kind; a kind nobody registered is a bug.</summary>
    public static IStepKind Of(StepDefinition step) =>
        Find(step) ?? throw new InvalidOperationException($"Step kind '{step.Kind}' ({step.GetType().Name}) has no descriptor in StepKinds.");

    /// <summary>The setpoint <paramref name="step"/> brings the source to or reads at, or null.</summary>
    public static string? SetpointOf(StepDefinition step) => Of(step).SetpointOf(step);
}
