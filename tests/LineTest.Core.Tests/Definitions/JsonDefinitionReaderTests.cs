using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Definitions;

public sealed class JsonDefinitionReaderTests
{
    [Fact]
    public void Parse_ValidFile_GivesValueHashAndLocatorWithoutProblems()
    {
        var parsed = JsonDefinitionReader.Parse<SequenceDefinition>("s.json", TestFiles.Utf8(TestFiles.SequenceBase));

        Assert.Empty(parsed.Problems);
        Assert.NotNull(parsed.Value);
        Assert.Equal(64, parsed.Sha256!.Length);
        Assert.Equal(TestFiles.LineOf(TestFiles.SequenceBase, "\"steps\""), parsed.Locator.LineOf("$.steps"));
    }

    [Fact]
    public void Parse_SyntaxError_KeepsTheLocatorForThePartBeforeIt()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"steps\": [", "\"steps\": [[[");

        var parsed = JsonDefinitionReader.Parse<SequenceDefinition>("s.json", TestFiles.Utf8(text));

        Assert.Null(parsed.Value);
        Assert.Single(parsed.Problems);
        Assert.Equal(TestFiles.LineOf(text, "\"stability\""), parsed.Locator.LineOf("$.stability"));
    }

    [Fact]
    public void Parse_UnknownKindInAFixture_HasNoKindListButStillAPlainReason()
    {
        // Fixtures have no polymorphic objects: the step-kind list must not leak into their messages.
        var text = TestFiles.Edit(TestFiles.FixtureBase, "\"rig\": \"simulator\",", "\"rig\": \"simulator\", \"extra\": 1,");

        var problem = Assert.Single(JsonDefinitionReader.Parse<FixtureDefinition>("f.json", TestFiles.Utf8(text)).Problems);

        Assert.Equal("unknown property 'extra' (check the spelling; keys are camelCase)", problem.Reason);
    }

    [Fact]
    public void Parse_StepWithoutKindInsideAnArrayOfSteps_ReportsInsteadOfThrowing()
    {
        // Regression: a step with no "kind" made the serialiser throw NotSupportedException, which escaped the
        // loader and stopped the station instead of naming the line.
        var text = TestFiles.Edit(TestFiles.SequenceBase, "{ \"kind\": \"settle\", \"setpoint\": \"cal-low\" }", "{ \"setpoint\": \"cal-low\" }");

        var parsed = JsonDefinitionReader.Parse<SequenceDefinition>("s.json", TestFiles.Utf8(text));

        var problem = Assert.Single(parsed.Problems);
        Assert.Equal("$.steps[2]", problem.JsonPath);
        Assert.Equal(TestFiles.LineOf(text, "{ \"setpoint\": \"cal-low\" }"), problem.Line);
        Assert.Equal("the object needs a 'kind' key naming its kind (known: identify, supply-current, settle, measure, trim, verify, prompt, iv-sweep)", problem.Reason);
    }

    [Fact]
    public void Parse_WrongTypeForAnObject_SaysAnObjectWasExpected()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"trim\": {", "\"trim\": 5, \"unused\": {");

        var problems = JsonDefinitionReader.Parse<SequenceDefinition>("s.json", TestFiles.Utf8(text)).Problems;

        // Both shape problems of the edit, not only the first: the wrong type and the key that does not belong.
        Assert.Equal(["$.trim", "$.unused"], problems.Select(p => p.JsonPath));
        Assert.Equal("expected an object, not a number", problems[0].Reason);
        Assert.DoesNotContain("LineTest.", problems[0].Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_BytesThatAreNotUtf8_ProblemAtTheirLineInsteadOfException()
    {
        // Regression: found by fuzzing, invalid UTF-8 made the serialiser throw InvalidOperationException.
        var bytes = TestFiles.Utf8("{\n  \"id\": \"x\",\n  \"product\": \"P\xff\"\n}");
        bytes[bytes.IndexOf((byte)0xC3)] = 0xFF;

        var parsed = JsonDefinitionReader.Parse<SequenceDefinition>("s.json", bytes);

        var problem = Assert.Single(parsed.Problems);
        Assert.Equal(3, problem.Line);
        Assert.Contains("not valid UTF-8", problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_NullListEntry_ProblemAtItsPathInsteadOfException()
    {
        // Regression: found by fuzzing, "setpoints": [null] reached the checker and threw NullReferenceException.
        var text = TestFiles.SequenceBase.Replace("\"setpoints\": [", "\"setpoints\": [null, ", StringComparison.Ordinal);
        Assert.NotEqual(TestFiles.SequenceBase, text);

        var result = SequenceLoader.Load("s.json", TestFiles.Utf8(text));

        var problem = Assert.Single(result.Problems);
        Assert.Equal("$.setpoints[0]", problem.JsonPath);
        Assert.NotNull(problem.Line);
    }
}
