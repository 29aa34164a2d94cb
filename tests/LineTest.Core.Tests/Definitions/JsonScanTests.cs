using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Definitions;

/// <summary>
/// Strict JSON for sequences and fixtures: a trailing comma, a comment or a key given twice is a problem with its
/// line (both lines for a key given twice). Before, all three were accepted, the last of two keys silently winning.
/// </summary>
public sealed class JsonScanTests
{
    private const string File = "strict.json";

    [Fact]
    public void Load_TrailingCommaInAnObject_IsAProblemAtTheCommasLine()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"timeoutSeconds\": 1800", "\"timeoutSeconds\": 1800,");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal("$.stability", problem.JsonPath);
        Assert.Equal(TestFiles.LineOf(text, "\"timeoutSeconds\": 1800,"), problem.Line);
        Assert.Contains("a comma before the closing '}' is not allowed", problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_TrailingCommaInAnArray_IsAProblemAtTheArray()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "{ \"name\": \"verify\", \"celsius\": 5 }", "{ \"name\": \"verify\", \"celsius\": 5 },");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal("$.setpoints", problem.JsonPath);
        Assert.Equal(TestFiles.LineOf(text, "\"verify\", \"celsius\": 5 },"), problem.Line);
        Assert.Contains("closing ']'", problem.Reason, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("// Tuned for the four-well block.")]
    [InlineData("/* Tuned for the four-well block. */")]
    public void Load_Comment_IsAProblemAtItsLine(string comment)
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "  \"stability\": {", $"  {comment}\n  \"stability\": {{");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal(TestFiles.LineOf(text, "Tuned for"), problem.Line);
        Assert.StartsWith("comments are not allowed", problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_KeyGivenTwice_NamesBothLines()
    {
        // Regression: the second value silently won.
        var text = TestFiles.Edit(TestFiles.FixtureBase, "\"standbyC\": 23,", "\"standbyC\": 23,\n    \"standbyC\": 150,");

        var problem = Assert.Single(FixtureLoader.Load(File, TestFiles.Utf8(text)).Problems);

        var first = TestFiles.LineOf(text, "\"standbyC\": 23");
        var second = TestFiles.LineOf(text, "\"standbyC\": 150");
        Assert.Equal("$.source.standbyC", problem.JsonPath);
        Assert.Equal(second, problem.Line);
        Assert.Equal($"'standbyC' is given twice: first at line {first}, again at line {second}; keep one", problem.Reason);
    }

    [Fact]
    public void Load_StrictProblemsAndModelProblems_AreAllListed()
    {
        // One structural slip must not hide the others: the trailing comma, the key given twice and the value of
        // the wrong type are three problems of one file.
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"timeoutSeconds\": 1800", "\"timeoutSeconds\": 1800,");
        text = TestFiles.Edit(text, "\"revision\": 1,", "\"revision\": 1,\n  \"revision\": 2,");
        text = TestFiles.Edit(text, "\"bandC\": 0.05,", "\"bandC\": \"0.05\",");

        var problems = SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems;

        Assert.Equal(["$.revision", "$.stability.bandC", "$.stability"], problems.Select(p => p.JsonPath));
        Assert.Equal(problems.Select(p => p.Line).Order(), problems.Select(p => p.Line));
    }

    public static TheoryData<string, string, string> SyntaxErrors => new()
    {
        { "{ \"id\": 'x' }", "$.id", "strings and keys need double quotes" },
        { "{ \"id\": \"x\" } {", "$", "there is more after the end of the object" },
        { "{ \"id\": \"x\",, \"a\": 1 }", "$", "a ',' where a value belongs" },
        { "{ \"id\": [1, 2 }", "$.id", "'}' does not close what is open here" },
        { "{ \"id\": \"a\tb\" }", "$.id", "control character" },
        { "", "$", "the file is empty" },
        { "   \n  ", "$", "the file is empty" },
    };

    [Theory]
    [MemberData(nameof(SyntaxErrors))]
    public void Parse_SyntaxError_IsNamedFromTheReadersPosition(string text, string path, string reason)
    {
        var problem = Assert.Single(JsonDefinitionReader.Parse<SequenceDefinition>(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal(path, problem.JsonPath);
        Assert.Contains(reason, problem.Reason, StringComparison.Ordinal);
        Assert.NotNull(problem.Line);
    }

    [Fact]
    public void Parse_TwoBadSteps_BothAreReportedWithTheirOwnPaths()
    {
        // Keep going past a bad step: an unknown kind in step 0 does not hide the misspelt key in step 3.
        var text = TestFiles.Edit(TestFiles.SequenceBase, "{ \"kind\": \"identify\" }", "{ \"kind\": \"identfy\" }");
        text = TestFiles.Edit(text, "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"samples\": 10,", "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"sample\": 10,");

        var problems = JsonDefinitionReader.Parse<SequenceDefinition>(File, TestFiles.Utf8(text)).Problems;

        Assert.Equal(["$.steps[0]", "$.steps[3].sample"], problems.Select(p => p.JsonPath));
        Assert.Equal([TestFiles.LineOf(text, "identfy"), TestFiles.LineOf(text, "\"sample\"")], problems.Select(p => p.Line ?? -1));
    }

    [Fact]
    public void Parse_WholeNumberTooLargeForItsKey_SaysSo()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"revision\": 1,", "\"revision\": 99999999999,");

        var problem = Assert.Single(JsonDefinitionReader.Parse<SequenceDefinition>(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal("$.revision", problem.JsonPath);
        Assert.Equal("expected a whole number, and 99999999999 is too large", problem.Reason);
    }
}
