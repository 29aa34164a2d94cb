using System.Reflection;
using System.Text.Json.Serialization;
using LineTest.Core.Sequences;
using LineTest.Runtime.Steps;

namespace LineTest.Runtime.Tests.Steps;

public sealed class StepExecutorsTests
{
    [Fact]
    public void All_EveryJsonDerivedStepKind_HasOneExecutor()
    {
        var kinds = typeof(StepDefinition).GetCustomAttributes<JsonDerivedTypeAttribute>().Select(a => a.DerivedType).ToList();
        var executed = StepExecutors.All.Select(e => e.StepType).ToList();

        Assert.NotEmpty(kinds);
        Assert.Equal(executed.Count, executed.Distinct().Count());
        Assert.Equal(kinds.OrderBy(t => t.Name), executed.OrderBy(t => t.Name));
    }

    [Fact]
    public void Of_EveryJsonDerivedStepKind_ReturnsTheExecutorOfThatRecord()
    {
        foreach (var kind in typeof(StepDefinition).GetCustomAttributes<JsonDerivedTypeAttribute>().Select(a => a.DerivedType))
        {
            var step = (StepDefinition)System.Runtime.CompilerServices.RuntimeHelpers.GetUninitializedObject(kind);

            Assert.Equal(kind, StepExecutors.Of(step).StepType);
        }
    }
}
