using LineTest.TestSupport;
using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Definitions;

/// <summary>
/// A file with structural problems (wrong types, unknown keys, an unknown step kind, strict-JSON slips) and problems of
/// sense: `check` lists both kinds, in one JSON-path numbering, and skips only the checks that depend on the broken part.
/// Expected problems are read off the edited files by hand [common practice: each edit is one of the examples].
/// </summary>
public sealed class ParsedDefinitionTests
{
    private const string File = "mixed.json";

    private static FixtureDefinition Fixture
    {
        get
        {
            var fixture = DefinitionFile.Fixture(TestFiles.FixtureBasePath);
            Assert.True(fixture.IsSuccess, string.Join(Environment.NewLine, fixture.Problems));
            return fixture.Value;
        }
    }

    [Fact]
    public void Finish_BadStepAndBadSetpointAndBadStability_ListsStructuralAndSemanticProblemsInFileOrder()
    {
        // Issue 15: "a file with one structural problem hides its other problems". A misspelt key in step 3, a setpoint
        // outside the fixture's safe range and a stability timeout shorter than the window: all three are reported.
        var text = TestFiles.SequenceBase;
        text = TestFiles.Edit(text, "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"samples\": 10,", "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"sample\": 10,");
        text = TestFiles.Edit(text, "{ \"name\": \"cal-high\", \"celsius\": 40 }", "{ \"name\": \"cal-high\", \"celsius\": 140 }");
        text = TestFiles.Edit(text, "\"timeoutSeconds\": 1800", "\"timeoutSeconds\": 60");

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.False(result.IsSuccess);
        Assert.Equal(["$.stability.timeoutSeconds", "$.setpoints[1].celsius", "$.steps[3].sample"], result.Problems.Select(p => p.JsonPath));
        Assert.Equal(
            [TestFiles.LineOf(text, "\"timeoutSeconds\": 60"), TestFiles.LineOf(text, "140"), TestFiles.LineOf(text, "\"sample\"")],
            result.Problems.Select(p => p.Line));
        Assert.Contains("unknown property 'sample'", result.Problems[2].Reason, StringComparison.Ordinal);
        Assert.Contains("outside the safe range", result.Problems[1].Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Finish_UnknownKindInFirstStep_StillChecksSetpointsAndSettingsButNotTheStepsAfterIt()
    {
        // "Keep going past a bad step": the unknown kind of step 0 does not hide a duplicate setpoint name or a bad
        // serial pattern; the steps after it are not judged against a placeholder (no invented problem there).
        var text = TestFiles.SequenceBase;
        text = TestFiles.Edit(text, "{ \"kind\": \"identify\" }", "{ \"kind\": \"identfy\" }");
        text = TestFiles.Edit(text, "{ \"name\": \"verify\", \"celsius\": 5 }", "{ \"name\": \"verify\", \"celsius\": 5 },\n    { \"name\": \"cal-low\", \"celsius\": -25 }");
        text = TestFiles.Edit(text, "[0-9]{4}", "[0-9{4}");

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.Equal(["$.serialPattern", "$.setpoints[3].name", "$.steps[0]"], result.Problems.Select(p => p.JsonPath));
        Assert.Contains("setpoint 'cal-low' is defined twice", result.Problems[1].Reason, StringComparison.Ordinal);
        Assert.Contains("unknown kind 'identfy'", result.Problems[2].Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Finish_BrokenSetpointName_SkipsTheStepsThatNameItInsteadOfCallingItMissing()
    {
        // The steps read the setpoints: with the name of 'verify' broken, "setpoint 'verify' does not exist" would be an
        // invented problem. The stability problem does not read the setpoints and is reported.
        var text = TestFiles.SequenceBase;
        text = TestFiles.Edit(text, "{ \"name\": \"verify\", \"celsius\": 5 }", "{ \"name\": 5, \"celsius\": 5 }");
        text = TestFiles.Edit(text, "\"bandC\": 0.05,", "\"bandC\": 0,");

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.Equal(["$.stability.bandC", "$.setpoints[2].name"], result.Problems.Select(p => p.JsonPath));
        Assert.Contains("expected a string, not a number", result.Problems[1].Reason, StringComparison.Ordinal);
        Assert.DoesNotContain(result.Problems, p => p.Reason.Contains("does not exist", StringComparison.Ordinal));
    }

    [Fact]
    public void Finish_TrailingCommaAndDuplicateStepName_ReportsBoth()
    {
        // Strict-JSON slips leave the document readable: every semantic check runs.
        var text = TestFiles.SequenceBase;
        text = TestFiles.Edit(text, "\"timeoutSeconds\": 1800\n", "\"timeoutSeconds\": 1800,\n");
        text = TestFiles.Edit(text, "\"name\": \"cal-high\", \"setpoint\": \"cal-high\"", "\"name\": \"cal-low\", \"setpoint\": \"cal-high\"");

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.Equal(2, result.Problems.Count);
        Assert.Equal(("$.stability", TestFiles.LineOf(text, "1800,")), (result.Problems[0].JsonPath, result.Problems[0].Line));
        Assert.Contains("remove the last comma", result.Problems[0].Reason, StringComparison.Ordinal);
        Assert.Equal("$.steps[5].name", result.Problems[1].JsonPath);
        Assert.Equal("step name 'cal-low' is already used at $.steps[3].name", result.Problems[1].Reason);
    }

    [Fact]
    public void Finish_MissingRequiredStabilityKeyAndBadTrimCode_ReportsTheTrimProblem()
    {
        // A missing required key gets a placeholder; its region (stability) is not judged, the trim is.
        var text = TestFiles.SequenceBase;
        text = TestFiles.Edit(text, "    \"bandC\": 0.05,\n", string.Empty);
        text = TestFiles.Edit(text, "\"nominal\": 2048, \"step\": 0.0001", "\"nominal\": 5000, \"step\": 0.0001");

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.Equal(["$.stability", "$.trim.dac.gain.nominal"], result.Problems.Select(p => p.JsonPath));
        Assert.Contains("missing required property 'bandC'", result.Problems[0].Reason, StringComparison.Ordinal);
        Assert.Contains("nominal code 5000 is outside 0 … 4095", result.Problems[1].Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Finish_FixtureWithWrongTypeAndDuplicateChannelAndBadSimulation_ListsAll()
    {
        var text = TestFiles.FixtureBase;
        text = TestFiles.Edit(text, "\"rangeVolts\": 10,", "\"rangeVolts\": \"10 V\",");
        text = TestFiles.Edit(text, "\"outputChannel\": 102", "\"outputChannel\": 101");
        text = TestFiles.Edit(text, "\"blockNoiseC\": 0.002,", "\"blockNoiseC\": -1,");

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        Assert.Equal(["$.meter.rangeVolts", "$.slots[1].outputChannel", "$.simulation.blockNoiseC"], result.Problems.Select(p => p.JsonPath));
        Assert.Contains("expected a number, not a string", result.Problems[0].Reason, StringComparison.Ordinal);
        Assert.Contains("meter channel 101 is already wired to the output of slot 1", result.Problems[1].Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Finish_FixtureWithBadRig_SkipsThePortChecksThatDependOnIt()
    {
        // The rig decides which ports are needed: with it broken, the source, meter and slot checks are skipped, the
        // simulation (which does not read the rig) is still judged.
        var text = TestFiles.FixtureBase;
        text = TestFiles.Edit(text, "\"rig\": \"simulator\"", "\"rig\": 7");
        text = TestFiles.Edit(text, "\"rangeVolts\": 10,", "\"rangeVolts\": 0,");
        text = TestFiles.Edit(text, "\"defectRate\": 0.04", "\"defectRate\": 4");

        var result = FixtureLoader.Load(File, TestFiles.Utf8(text));

        Assert.Equal(["$.rig", "$.simulation.defectRate"], result.Problems.Select(p => p.JsonPath));
    }

    [Fact]
    public void Finish_ValueThatIsNotAnObject_GivesOnlyItsOwnProblem()
    {
        var result = SequenceLoader.Load(File, TestFiles.Utf8("[1, 2]"));

        var problem = Assert.Single(result.Problems);
        Assert.Equal("$", problem.JsonPath);
    }

    [Theory]
    [InlineData(typeof(SequenceDefinition))]
    [InlineData(typeof(FixtureDefinition))]
    public void Reads_NamesEveryTopLevelKeyOfTheModel(Type type)
    {
        // A new key with no entry would read everything (safe, but it would hide problems): the table must follow the model.
        var reads = type == typeof(SequenceDefinition) ? SequenceLoader.Reads : FixtureLoader.Reads;
        var keys = LineTestJson.Definitions.GetTypeInfo(type).Properties.Select(p => p.Name).Order(StringComparer.Ordinal);

        Assert.Equal(keys, reads.Keys.Order(StringComparer.Ordinal));
        Assert.All(reads.Values.SelectMany(v => v), r => Assert.True(r == DependentProblems.Everything || reads.ContainsKey(r), r));
    }
}
