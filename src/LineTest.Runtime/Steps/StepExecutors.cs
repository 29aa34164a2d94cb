using LineTest.Core.Sequences;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Every step kind's executor, one per <c>[JsonDerivedType]</c> of <see cref="StepDefinition"/> (a test holds the lists
/// together, beside Core's <c>StepKinds</c>).
/// </summary>
internal static class StepExecutors
{
    private static readonly IStepExecutor[] Executors =
    [
        new IdentifyExecutor(),
        new SupplyCurrentExecutor(),
        new SettleExecutor(),
        new MeasureExecutor(),
        new TrimExecutor(),
        new VerifyExecutor(),
        new PromptExecutor(),
        new IvSweepExecutor(),
    ];

    private static readonly Dictionary<Type, IStepExecutor> ByType = Executors.ToDictionary(e => e.StepType);

    public static IReadOnlyList<IStepExecutor> All => Executors;

    /// <summary>The executor of <paramref name="step"/>'s kind; a kind without one is a bug (the checker refuses it first).</summary>
    public static IStepExecutor Of(StepDefinition step) =>
        ByType.GetValueOrDefault(step.GetType()) ?? throw new InvalidOperationException($"Step kind '{step.Kind}' has no executor.");
}
