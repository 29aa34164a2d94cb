using LineTest.TestSupport;
using System.Security.Cryptography;
using System.Text;
using LineTest.Core.Definitions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Sequences;

public sealed class SequenceLoaderTests
{
    private const string File = "bad.json";

    private const string VerifyLimits = "\"limits\": { \"low\": -0.5, \"high\": 0.5, \"unit\": \"degC\" }";

    /// <summary>
    /// One kind of bad file: an edit of the valid base sequence, and where and why the loader must complain.
    /// The expected line is the line of <see cref="LineMarker"/> in the edited text, counted independently.
    /// </summary>
    private sealed record BadSequence(string Find, string Replace, string LineMarker, string Path, string Reason, int ProblemCount = 1);

    private static readonly Dictionary<string, BadSequence> BadSequences = new(StringComparer.Ordinal)
    {
        // Syntax: the reader stops at the first one.
        ["missing comma"] = new("\"revision\": 1,", "\"revision\": 1", "\"revision\": 1", "$", "a comma is missing after this value"),
        ["unterminated string"] = new("\"product\": \"CTP-40A\",", "\"product\": \"CTP-40A,", "\"product\"", "$.product", "a string is not closed"),
        ["NaN literal"] = new("\"bandC\": 0.05,", "\"bandC\": NaN,", "\"bandC\"", "$.stability.bandC", "NaN and Infinity are not allowed"),

        // Types and shape.
        ["string where a number is"] = new("\"bandC\": 0.05,", "\"bandC\": \"0.05\",", "\"bandC\"", "$.stability.bandC", "expected a number"),
        ["fraction where a whole number is"] = new("\"revision\": 1,", "\"revision\": 1.5,", "\"revision\"", "$.revision", "expected a whole number"),
        ["null where a string is"] = new("\"id\": \"ctp40a-dac\",", "\"id\": null,", "\"id\"", "$.id", "a value is required here, not null"),
        ["missing required property"] = new("    \"bandC\": 0.05,\n", string.Empty, "\"stability\": {", "$.stability", "missing required property 'bandC'"),
        ["misspelt key"] = new("\"bandC\": 0.05,", "\"bandc\": 0.05,", "\"bandc\"", "$.stability.bandc", "unknown property 'bandc'", ProblemCount: 2),
        ["misspelt key in a step"] = new("\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"samples\": 10,", "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"sample\": 10,",
            "\"sample\"", "$.steps[3].sample", "unknown property 'sample'"),
        ["unknown step kind"] = new("{ \"kind\": \"identify\" }", "{ \"kind\": \"identfy\" }", "identfy", "$.steps[0]",
            "unknown kind 'identfy' (known: identify, supply-current, settle, measure, trim, verify, prompt, iv-sweep)"),
        ["step without kind"] = new("{ \"kind\": \"identify\" }", "{ \"name\": \"who\" }", "\"who\"", "$.steps[0]", "needs a 'kind' key"),
        ["kind given twice"] = new("{ \"kind\": \"identify\" }", "{ \"kind\": \"identify\", \"kind\": \"settle\" }", "\"kind\": \"identify\", \"kind\"", "$.steps[0].kind", "'kind' is given twice"),

        // Limits and units.
        ["low limit above high limit"] = new("\"low\": 1.5, \"high\": 4.0", "\"low\": 5.5, \"high\": 4.0", "supply.current", "$.steps[1].limits.low",
            "the low limit (5.5) is above the high limit (4)"),
        ["unknown unit of measure"] = new("\"unit\": \"mA\"", "\"unit\": \"ma\"", "supply.current", "$.steps[1].limits.unit", "unknown unit of measure 'ma'"),
        ["voltage unit on supply current"] = new("\"unit\": \"mA\"", "\"unit\": \"V\"", "supply.current", "$.steps[1].limits.unit",
            "unit 'V' does not fit this reading (use A, mA, uA)"),
        ["current unit on verify error"] = new("\"unit\": \"degC\"", "\"unit\": \"mA\"", "\"guarded\"", "$.steps[8].limits.unit", "unit 'mA' does not fit this reading (use degC, K)"),
        ["unknown decision rule"] = new("\"rule\": \"guarded\"", "\"rule\": \"guardbanded\"", "guardbanded", "$.steps[8].limits.rule", "unknown decision rule 'guardbanded'"),

        // Setpoints.
        ["step naming a setpoint that does not exist"] = new("{ \"kind\": \"settle\", \"setpoint\": \"verify\" }", "{ \"kind\": \"settle\", \"setpoint\": \"verfy\" }", "verfy",
            "$.steps[7].setpoint", "setpoint 'verfy' does not exist (known: cal-high, cal-low, verify)"),
        ["setpoint outside the fixture's safe range"] = new("{ \"name\": \"cal-high\", \"celsius\": 40 }", "{ \"name\": \"cal-high\", \"celsius\": 140 }", "140",
            "$.setpoints[1].celsius", "140 °C is outside the safe range of fixture 'sim-dryblock-4' (-30 … 125 °C)"),
        ["duplicate setpoint name"] = new("{ \"name\": \"verify\", \"celsius\": 5 }", "{ \"name\": \"verify\", \"celsius\": 5 },\n    { \"name\": \"cal-low\", \"celsius\": -25 }", "-25",
            "$.setpoints[3].name", "setpoint 'cal-low' is defined twice"),

        // Step order.
        ["measure before any settle"] = new("    { \"kind\": \"settle\", \"setpoint\": \"cal-low\" },\n", string.Empty, "\"name\": \"cal-low\", \"setpoint\"", "$.steps[2].setpoint",
            "no settle step brings the source to 'cal-low' before this step"),
        ["measure at a setpoint other than the one settled"] = new("{ \"kind\": \"settle\", \"setpoint\": \"cal-high\" }", "{ \"kind\": \"settle\", \"setpoint\": \"verify\" }",
            "\"name\": \"cal-high\", \"setpoint\"", "$.steps[5].setpoint", "the source is settled at 'verify' here, not at 'cal-high'"),
        ["trim with one point"] = new("\"points\": [ \"cal-low\", \"cal-high\" ]", "\"points\": [ \"cal-low\" ]", "\"points\"", "$.steps[6].points",
            "a trim needs calibration points from two setpoints or more"),
        ["trim point without a measure step"] = new("\"points\": [ \"cal-low\", \"cal-high\" ]", "\"points\": [ \"cal-low\", \"verify\" ]", "\"points\"", "$.steps[6].points[1]",
            "setpoint 'verify' has no measure step before this trim step"),
        ["trim point listed twice"] = new("\"points\": [ \"cal-low\", \"cal-high\" ]", "\"points\": [ \"cal-low\", \"cal-high\", \"cal-low\" ]", "\"points\"", "$.steps[6].points[2]",
            "setpoint 'cal-low' is listed twice"),
        ["verify before trim"] = new("    { \"kind\": \"settle\", \"setpoint\": \"cal-high\" },\n",
            $"    {{ \"kind\": \"verify\", \"name\": \"early\", \"setpoint\": \"cal-low\", {VerifyLimits} }},\n    {{ \"kind\": \"settle\", \"setpoint\": \"cal-high\" }},\n",
            "\"early\"", "$.steps[4]", "a verify step must come after the trim step"),
        ["duplicate step name"] = new("\"name\": \"cal-high\", \"setpoint\": \"cal-high\"", "\"name\": \"cal-low\", \"setpoint\": \"cal-high\"", "\"name\": \"cal-low\", \"setpoint\": \"cal-high\"",
            "$.steps[5].name", "step name 'cal-low' is already used at $.steps[3].name"),
        ["no samples"] = new("\"name\": \"verify.error\", \"setpoint\": \"verify\", \"samples\": 10", "\"name\": \"verify.error\", \"setpoint\": \"verify\", \"samples\": 0", "verify.error",
            "$.steps[8].samples", "must be a whole number 1 … 1000, not 0"),

        // Header, stability, soak and trim settings.
        ["invalid serial regex"] = new("[0-9]{4}", "[0-9{4}", "serialPattern", "$.serialPattern", "not a valid regular expression"),
        ["stability timeout not longer than the window"] = new("\"timeoutSeconds\": 1800", "\"timeoutSeconds\": 60", "\"timeoutSeconds\": 60", "$.stability.timeoutSeconds",
            "the timeout must be longer than the stability window"),
        ["stability window shorter than two sample intervals"] = new("\"windowSeconds\": 60,", "\"windowSeconds\": 8,", "\"windowSeconds\": 8", "$.stability.windowSeconds",
            "the window must hold at least three readings"),
        ["stability band zero"] = new("\"bandC\": 0.05,", "\"bandC\": 0,", "\"bandC\"", "$.stability.bandC", "must be a number above 0 and at most 100 °C, not 0"),
        ["stability band overflowing"] = new("\"bandC\": 0.05,", "\"bandC\": 1e999,", "\"bandC\"", "$.stability.bandC", "the number is too large to be used"),
        ["negative offset from setpoint"] = new("\"bandC\": 0.05,", "\"bandC\": 0.05, \"maxOffsetFromSetpointC\": -1,", "\"bandC\"", "$.stability.maxOffsetFromSetpointC",
            "must be a number above 0 and at most 100 °C, not -1"),
        ["negative minimum soak"] = new("\"minimumSeconds\": 30,", "\"minimumSeconds\": -1,", "minimumSeconds", "$.soak.minimumSeconds", "must be a number 0 … 28800 s, not -1"),

        // Regression: the soak's drift window only starts after the minimum soak, so a timeout shorter than both
        // together can never be met and used to pass the check.
        ["soak timeout shorter than minimum plus window"] = new("\"timeoutSeconds\": 900", "\"timeoutSeconds\": 50", "\"timeoutSeconds\": 50", "$.soak.timeoutSeconds",
            "the timeout (50 s) must be at least the minimum soak plus the window (60 s)"),
        ["DAC nominal outside its range"] = new("\"nominal\": 2048, \"step\": 0.0001", "\"nominal\": 5000, \"step\": 0.0001", "\"GAIN\"", "$.trim.dac.gain.nominal",
            "nominal code 5000 is outside 0 … 4095"),
        ["DAC min not below max"] = new("\"min\": 0, \"max\": 4095, \"nominal\": 2048, \"step\": 0.0005", "\"min\": 4095, \"max\": 4095, \"nominal\": 4095, \"step\": 0.0005", "\"OFFSET\"",
            "$.trim.dac.offset.min", "min (4095) must be below max (4095)"),
        ["DAC target slope zero"] = new("\"slopeVoltsPerC\": 0.01", "\"slopeVoltsPerC\": 0", "slopeVoltsPerC", "$.trim.dac.target.slopeVoltsPerC", "must be a finite number other than 0"),
        ["unknown trim method"] = new("\"method\": \"dac\"", "\"method\": \"dacs\"", "\"method\"", "$.trim.method", "unknown trim method 'dacs' (known: dac, resistor, firmware)"),
    };

    public static TheoryData<string> BadSequenceNames => new(BadSequences.Keys);

    /// <summary>Bad edits of the shipped resistor and firmware sequences (file, edit, where and why).</summary>
    private static readonly Dictionary<string, (string File, BadSequence Bad)> BadVariantSequences = new(StringComparer.Ordinal)
    {
        ["unknown setpoint order"] = ("ctp40r-resistor.json", new("\"setpointOrder\": \"free\"", "\"setpointOrder\": \"shortest\"", "\"setpointOrder\"",
            "$.setpointOrder", "'shortest' is not a setpoint order: use \"fixed\" or \"free\"")),
        ["resistor series unknown"] = ("ctp40r-resistor.json", new("\"series\": \"E96\"", "\"series\": \"E97\"", "\"series\"", "$.trim.resistor.series",
            "'E97' is not one of E12, E24, E48, E96")),
        ["resistor gain range reversed"] = ("ctp40r-resistor.json", new("\"minOhms\": 2000, \"maxOhms\": 100000", "\"minOhms\": 2000, \"maxOhms\": 1000",
            "\"R7\"", "$.trim.resistor.gain.maxOhms", "must be at least minOhms")),
        ["resistor tolerance negative"] = ("ctp40r-resistor.json", new("\"tolerancePercent\": 0.1", "\"tolerancePercent\": -1", "tolerancePercent",
            "$.trim.resistor.tolerancePercent", "must be a number 0 … 50 %, not -1")),
        ["resistor object misspelt"] = ("ctp40r-resistor.json", new("\"resistor\": {", "\"resistors\": {", "\"resistors\"", "$.trim.resistors",
            "unknown property 'resistors'")),
        ["resistor object with a dac method"] = ("ctp40r-resistor.json", new("\"method\": \"resistor\"", "\"method\": \"dac\"", "\"trim\": {", "$.trim",
            "method 'dac' needs a 'dac' object", 2)),
        ["firmware register too wide"] = ("ctp40d-firmware.json", new("\"register\": \"C1\", \"bits\": 32", "\"register\": \"C1\", \"bits\": 60", "\"C1\"",
            "$.trim.firmware.coefficients[1].bits", "60 is outside 2…53")),
        ["firmware order without its registers"] = ("ctp40d-firmware.json", new("\"order\": 2", "\"order\": 1", "\"coefficients\"", "$.trim.firmware.coefficients",
            "order 1 needs 2 registers, got 3")),
        ["firmware register without a format"] = ("ctp40d-firmware.json", new("\"bits\": 32, \"fractionalBits\": 16", "\"bits\": 32", "\"C0\"",
            "$.trim.firmware.coefficients[0]", "give exactly one of fractionalBits and scale")),
        ["firmware measure over the meter"] = ("ctp40d-firmware.json", new("\"name\": \"cal-high\", \"setpoint\": \"cal-high\", \"samples\": 10, \"output\": \"link\"",
            "\"name\": \"cal-high\", \"setpoint\": \"cal-high\", \"samples\": 10, \"output\": \"meter\"", "\"name\": \"cal-high\", \"setpoint\"", "$.steps[5].output",
            "a firmware trim is computed from the unit's raw counts", 2)),
        ["unknown output word"] = ("ctp40d-firmware.json", new("\"verify\", \"samples\": 10, \"output\": \"link\"", "\"verify\", \"samples\": 10, \"output\": \"usb\"",
            "\"usb\"", "$.steps[8].output", "unknown output 'usb' (known: meter, link)")),
        ["link soak without raw sensitivity"] = ("ctp40d-firmware.json", new(",\n    \"outputCountsPerC\": 1670", string.Empty, "\"soak\": {", "$.soak",
            "give soak.outputCountsPerC")),
    };

    public static TheoryData<string> BadVariantSequenceNames => new(BadVariantSequences.Keys);

    public static TheoryData<string> ShippedSequenceFiles => new("ctp40a-dac.json", "ctp40r-resistor.json", "ctp40d-firmware.json");

    private static string ShippedSequence(string file) => Path.Combine(AppContext.BaseDirectory, "Shipped", "sequences", file);

    [Theory]
    [MemberData(nameof(ShippedSequenceFiles))]
    public void LoadFile_EveryShippedSequenceAgainstShippedFixture_LoadsWithoutProblems(string file)
    {
        var fixture = DefinitionFile.Fixture(TestFiles.ShippedFixturePath);
        Assert.True(fixture.IsSuccess, string.Join(Environment.NewLine, fixture.Problems));

        var result = DefinitionFile.Sequence(ShippedSequence(file), fixture.Value);

        Assert.Empty(result.Problems);
        Assert.Equal(Path.GetFileNameWithoutExtension(file), result.Value!.Id);
        Assert.All(result.Value.Setpoints, s => Assert.InRange(s.Celsius, fixture.Value.Source.SafeMinC, fixture.Value.Source.SafeMaxC));
    }

    [Fact]
    public void LoadFile_ShippedResistorSequence_ReadsTheResistorSpec()
    {
        var result = DefinitionFile.Sequence(ShippedSequence("ctp40r-resistor.json"));

        Assert.True(result.IsSuccess, string.Join(Environment.NewLine, result.Problems));
        var trim = result.Value.Trim!;
        Assert.Equal("resistor", trim.Method);
        Assert.Null(trim.Dac);
        Assert.Equal(("E96", true, 0.1), (trim.Resistor!.Series, trim.Resistor.AllowPairs, trim.Resistor.TolerancePercent));
        Assert.Equal(("R7", 10000.0), (trim.Resistor.Gain.Position, trim.Resistor.Gain.FittedOhms!.Value));
        Assert.Equal(("R8", 2.5, 71500.0), (trim.Resistor.Offset.Position, trim.Resistor.Offset.ReferenceVolts, trim.Resistor.Offset.FittedOhms!.Value));
        Assert.Same(trim.Resistor.Target, trim.AnalogTarget);
        Assert.Equal("meter", result.Value.Steps.OfType<MeasureStep>().First().Output);
    }

    [Fact]
    public void LoadFile_ShippedFirmwareSequence_ReadsRegistersAndLinkOutputs()
    {
        var result = DefinitionFile.Sequence(ShippedSequence("ctp40d-firmware.json"));

        Assert.True(result.IsSuccess, string.Join(Environment.NewLine, result.Problems));
        var firmware = result.Value.Trim!.Firmware!;
        Assert.Equal(2, firmware.Order);
        Assert.Equal(["C0", "C1", "C2"], firmware.Coefficients.Select(c => c.Register));
        Assert.Equal(Math.ScaleB(1.0, -40), firmware.Coefficients[1].Lsb);
        Assert.Null(result.Value.Trim.AnalogTarget);
        Assert.Equal(("link", 1670.0), (result.Value.Soak.Output, result.Value.Soak.OutputCountsPerC!.Value));
        Assert.All(result.Value.Steps.OfType<MeasureStep>(), m => Assert.Equal(("link", "count"), (m.Output, m.OutputLimits!.Unit)));
        Assert.Equal("link", result.Value.Steps.OfType<VerifyStep>().Single().Output);
    }

    [Theory]
    [MemberData(nameof(BadVariantSequenceNames))]
    public void Load_BadResistorOrFirmwareFile_ReportsLinePathAndReason(string name)
    {
        var (file, bad) = BadVariantSequences[name];
        var text = TestFiles.Edit(System.IO.File.ReadAllText(ShippedSequence(file)), bad.Find, bad.Replace);

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.False(result.IsSuccess);
        var problem = Assert.Single(result.Problems, p => p.JsonPath == bad.Path);
        Assert.Equal(TestFiles.LineOf(text, bad.LineMarker), problem.Line);
        Assert.Contains(bad.Reason, problem.Reason, StringComparison.Ordinal);
        Assert.Equal(bad.ProblemCount, result.Problems.Count);
    }

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
    public void LoadFile_ShippedDemoSequence_LoadsWithoutProblems()
    {
        var result = DefinitionFile.Sequence(TestFiles.ShippedSequencePath);

        Assert.Empty(result.Problems);
        Assert.True(result.IsSuccess);
        Assert.Equal("ctp40a-dac", result.Value.Id);
        Assert.Equal(11, result.Value.Steps.Count);
    }

    [Fact]
    public void LoadFile_ShippedDemoSequenceAgainstShippedFixture_LoadsWithoutProblems()
    {
        var fixture = DefinitionFile.Fixture(TestFiles.ShippedFixturePath);
        Assert.True(fixture.IsSuccess, string.Join(Environment.NewLine, fixture.Problems));

        var result = DefinitionFile.Sequence(TestFiles.ShippedSequencePath, fixture.Value);

        Assert.Empty(result.Problems);
        Assert.True(result.IsSuccess);
    }

    [Fact]
    public void LoadFile_ShippedDemoSequence_ReadsStepsAsTheirKinds()
    {
        var result = DefinitionFile.Sequence(TestFiles.ShippedSequencePath);

        Assert.True(result.IsSuccess);
        Assert.Equal(
            ["identify", "supply-current", "settle", "iv-sweep", "measure", "settle", "measure", "iv-sweep", "trim", "settle", "verify"],
            result.Value.Steps.Select(s => s.Kind));
        var supply = Assert.IsType<SupplyCurrentStep>(result.Value.Steps[1]);
        Assert.Equal(1.5, supply.Limits.Low);
        Assert.Equal("mA", supply.Limits.Unit);
        var trim = Assert.IsType<TrimStep>(result.Value.Steps[8]);
        var sweep = Assert.IsType<IvSweepStep>(result.Value.Steps[7]);
        Assert.Equal("cal-high", sweep.Setpoint);
        Assert.Equal(7, sweep.SweepCurrents().Count);
        Assert.Equal("mV/degC", sweep.TemperatureCoefficientLimits!.Unit);
        Assert.Equal(10e-6, result.Value.NominalBiasAmps);
        Assert.Equal(["cal-low", "cal-high"], trim.Points);
        Assert.Equal(["verify"], trim.PredictAt);
        Assert.Equal("identify", result.Value.Steps[0].DisplayName);
    }

    [Fact]
    public void Load_BaseTestSequence_IsValidAgainstTheFixture()
    {
        // Every bad-file case below is one edit of this file; it must itself be clean.
        var result = SequenceLoader.Load(File, TestFiles.Utf8(TestFiles.SequenceBase), Fixture);

        Assert.Empty(result.Problems);
    }

    [Theory]
    [MemberData(nameof(BadSequenceNames))]
    public void Load_BadFile_ReportsLinePathAndReason(string name)
    {
        var bad = BadSequences[name];
        var text = TestFiles.Edit(TestFiles.SequenceBase, bad.Find, bad.Replace);

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.False(result.IsSuccess);
        Assert.Null(result.Value);
        var problem = Assert.Single(result.Problems, p => p.JsonPath == bad.Path);
        Assert.Equal(File, problem.File);
        Assert.Equal(TestFiles.LineOf(text, bad.LineMarker), problem.Line);
        Assert.Contains(bad.Reason, problem.Reason, StringComparison.Ordinal);
        Assert.Equal(bad.ProblemCount, result.Problems.Count);
    }

    [Fact]
    public void Load_MissingComma_NamesTheLineOfTheValueBeforeIt()
    {
        // The comma belongs at the end of line 4; the reader only notices at the key on line 5.
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"revision\": 1,", "\"revision\": 1");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal(4, problem.Line);
        Assert.Equal(5, TestFiles.LineOf(text, "\"product\""));
    }

    [Fact]
    public void Load_TruncatedFile_ReportsTheEndOfTheFile()
    {
        var full = TestFiles.SequenceBase;
        var text = full[..full.IndexOf("\"soak\"", StringComparison.Ordinal)];

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text));

        var problem = Assert.Single(result.Problems);
        Assert.Equal(text.Count(c => c == '\n') + 1, problem.Line);
        Assert.Equal("$", problem.JsonPath);
        Assert.Contains("the file ends before every object and array is closed", problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_FileCutInsideTheLastObject_ReportsTheEndOfTheFile()
    {
        var text = TestFiles.SequenceBase.TrimEnd().TrimEnd('}');

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal(text.Count(c => c == '\n') + 1, problem.Line);
        Assert.Contains("is it cut short?", problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_MissingRequiredTopLevelProperties_NamesThemAllAtLineOne()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "  \"id\": \"ctp40a-dac\",\n  \"revision\": 1,\n", string.Empty);

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal(1, problem.Line);
        Assert.Equal("$", problem.JsonPath);
        Assert.Equal("missing required properties 'id', 'revision'", problem.Reason);
    }

    [Fact]
    public void Load_MisspeltSettleSetpoint_ReportsOneProblemNotOnePerFollowingStep()
    {
        // Regression: the measure after a settle at an unknown setpoint used to add "the source is settled at
        // 'cal-low' here, not at 'cal-high'", blaming a correct step for the typo above it.
        var text = TestFiles.Edit(TestFiles.SequenceBase, "{ \"kind\": \"settle\", \"setpoint\": \"cal-high\" }", "{ \"kind\": \"settle\", \"setpoint\": \"cal_high\" }");

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text));

        var problem = Assert.Single(result.Problems);
        Assert.Equal("$.steps[4].setpoint", problem.JsonPath);
        Assert.Equal(TestFiles.LineOf(text, "cal_high"), problem.Line);
    }

    [Fact]
    public void Load_SetpointOutsideSafeRangeWithoutFixture_IsNotChecked()
    {
        // The safe range belongs to the fixture; a sequence alone cannot be judged against it.
        var text = TestFiles.Edit(TestFiles.SequenceBase, "{ \"name\": \"cal-high\", \"celsius\": 40 }", "{ \"name\": \"cal-high\", \"celsius\": 140 }");

        Assert.True(SequenceLoader.Load(File, TestFiles.Utf8(text)).IsSuccess);
    }

    [Fact]
    public void Load_SetpointOnTheSafeLimit_IsAccepted()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "{ \"name\": \"cal-low\", \"celsius\": -20 }", "{ \"name\": \"cal-low\", \"celsius\": -30 }");

        Assert.True(SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture).IsSuccess);
    }

    [Fact]
    public void Load_SeveralProblems_ReportsEveryOneWithItsOwnLine()
    {
        var text = TestFiles.SequenceBase;
        text = TestFiles.Edit(text, "\"timeoutSeconds\": 1800", "\"timeoutSeconds\": 30");
        text = TestFiles.Edit(text, "{ \"name\": \"cal-high\", \"celsius\": 40 }", "{ \"name\": \"cal-high\", \"celsius\": 140 }");
        text = TestFiles.Edit(text, "\"nominal\": 2048, \"step\": 0.0001", "\"nominal\": -1, \"step\": 0.0001");
        text = TestFiles.Edit(text, "\"low\": 1.5, \"high\": 4.0, \"unit\": \"mA\"", "\"low\": 5.5, \"high\": 4.0, \"unit\": \"V\"");
        text = TestFiles.Edit(text, "\"points\": [ \"cal-low\", \"cal-high\" ]", "\"points\": [ \"cal-low\" ]");

        var result = SequenceLoader.Load(File, TestFiles.Utf8(text), Fixture);

        Assert.Equal(
            [
                ("$.stability.timeoutSeconds", TestFiles.LineOf(text, "\"timeoutSeconds\": 30")),
                ("$.setpoints[1].celsius", TestFiles.LineOf(text, "140")),
                ("$.trim.dac.gain.nominal", TestFiles.LineOf(text, "\"GAIN\"")),
                ("$.steps[1].limits.unit", TestFiles.LineOf(text, "supply.current")),
                ("$.steps[1].limits.low", TestFiles.LineOf(text, "supply.current")),
                ("$.steps[6].points", TestFiles.LineOf(text, "\"points\"")),
            ],
            result.Problems.Select(p => (p.JsonPath, p.Line ?? -1)));
        Assert.All(result.Problems, p => Assert.False(string.IsNullOrWhiteSpace(p.Reason)));
    }

    [Fact]
    public void Load_ByteOrderMark_IsAccepted()
    {
        var bytes = Encoding.UTF8.GetPreamble().Concat(TestFiles.Utf8(TestFiles.SequenceBase)).ToArray();

        var result = SequenceLoader.Load(File, bytes, Fixture);

        Assert.Empty(result.Problems);
        Assert.Equal(3, result.Value!.Setpoints.Count);
    }

    [Fact]
    public void Load_ByteOrderMarkWithAProblem_StillNamesTheLine()
    {
        // Regression: the locator read the raw bytes and stopped at the byte-order mark, so every problem
        // found after parsing came out without a line.
        var text = TestFiles.Edit(TestFiles.SequenceBase, "{ \"name\": \"cal-high\", \"celsius\": 40 }", "{ \"name\": \"cal-high\", \"celsius\": 140 }");
        var bytes = Encoding.UTF8.GetPreamble().Concat(TestFiles.Utf8(text)).ToArray();

        var problem = Assert.Single(SequenceLoader.Load(File, bytes, Fixture).Problems);

        Assert.Equal(TestFiles.LineOf(text, "140"), problem.Line);
    }

    [Fact]
    public void Load_WindowsLineEndings_GiveTheSameLines()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"unit\": \"mA\"", "\"unit\": \"V\"");
        var crlf = text.ReplaceLineEndings("\r\n");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(crlf)).Problems);

        Assert.Equal(TestFiles.LineOf(text, "supply.current"), problem.Line);
    }

    [Fact]
    public void Load_MissingCommaAfterAString_NamesTheStringsLine()
    {
        var text = TestFiles.Edit(TestFiles.SequenceBase, "\"product\": \"CTP-40A\",", "\"product\": \"CTP-40A\"");

        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8(text)).Problems);

        Assert.Equal(TestFiles.LineOf(text, "\"product\""), problem.Line);
    }

    [Fact]
    public void Load_NullDocument_ReportsLineOne()
    {
        var problem = Assert.Single(SequenceLoader.Load(File, TestFiles.Utf8("null")).Problems);

        Assert.Equal(1, problem.Line);
        Assert.Contains("null instead of an object", problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_SameBytes_GiveTheirSha256WhetherValidOrNot()
    {
        var good = TestFiles.Utf8(TestFiles.SequenceBase);
        var bad = TestFiles.Utf8(TestFiles.Edit(TestFiles.SequenceBase, "\"unit\": \"mA\"", "\"unit\": \"V\""));

        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(good)), SequenceLoader.Load(File, good).Sha256);
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(bad)), SequenceLoader.Load(File, bad).Sha256);
    }

    [Fact]
    public void LoadFile_SameContentAsLoad_GivesTheSameResult()
    {
        var fromFile = DefinitionFile.Sequence(TestFiles.SequenceBasePath);
        var fromBytes = SequenceLoader.Load(TestFiles.SequenceBasePath, System.IO.File.ReadAllBytes(TestFiles.SequenceBasePath));

        Assert.True(fromFile.IsSuccess);
        Assert.Equal(fromBytes.Sha256, fromFile.Sha256);
        Assert.Equal(fromBytes.Value!.Setpoints, fromFile.Value.Setpoints);
        Assert.Equal(fromBytes.Value.Steps.Select(s => (s.Kind, s.DisplayName)), fromFile.Value.Steps.Select(s => (s.Kind, s.DisplayName)));
    }
}
