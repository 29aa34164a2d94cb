using LineTest.Core.Definitions;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Definitions;

public sealed class ProblemListTests
{
    [Fact]
    public void AddIf_FalseCondition_AddsNothing()
    {
        var problems = new ProblemList();

        problems.AddIf(false, "$.a", "never");

        Assert.Empty(problems.Items);
    }

    [Fact]
    public void Add_SeveralProblems_KeepsThemInOrder()
    {
        var problems = new ProblemList();

        problems.Add("$.b", "second key");
        problems.AddIf(true, "$.a", "first key");

        Assert.Equal([("$.b", "second key"), ("$.a", "first key")], problems.Items);
    }

    [Fact]
    public void Locate_ProblemsOnOneLine_KeepTheirOrder()
    {
        var locator = JsonLocator.Build(TestFiles.Utf8("{ \"a\": 1, \"b\": 2 }"));
        var problems = new ProblemList();
        problems.Add("$.b", "first found");
        problems.Add("$.a", "second found");

        Assert.Equal(["first found", "second found"], problems.Locate("f.json", locator).Select(p => p.Reason));
    }

    [Fact]
    public void Locate_EachProblem_GetsTheLineOfItsPathOrOfItsParentInFileOrder()
    {
        var locator = JsonLocator.Build(TestFiles.Utf8("{\n  \"a\": 1,\n  \"b\": {\n    \"c\": 2\n  }\n}"));
        var problems = new ProblemList();
        problems.Add("$.b.c", "c is wrong");
        problems.Add("$.b.missing", "b lacks something");
        problems.Add("$.a", "a is wrong");

        var located = problems.Locate("f.json", locator);

        Assert.Equal(
            [
                new DefinitionProblem("f.json", 2, "$.a", "a is wrong"),
                new DefinitionProblem("f.json", 3, "$.b.missing", "b lacks something"),
                new DefinitionProblem("f.json", 4, "$.b.c", "c is wrong"),
            ],
            located);
    }
}
