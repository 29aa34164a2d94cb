using System.Text.Json;
using LineTest.Core.Results;
using LineTest.Storage.Json;
using LineTest.TestSupport.Builders;

namespace LineTest.Storage.Tests.Json;

public sealed class RunJsonTests
{
    [Fact]
    public void Serialize_Run_UsesCamelCaseAndVerdictWords()
    {
        var run = new RunRecordBuilder().Failing("verify.error", "too warm").Build();

        using var document = JsonDocument.Parse(RunJson.Serialize(run));
        var root = document.RootElement;

        Assert.Equal("fail", root.GetProperty("verdict").GetString());
        Assert.Equal(run.Serial, root.GetProperty("serial").GetString());
        Assert.Equal(run.SequenceRevision, root.GetProperty("sequenceRevision").GetInt32());
        Assert.Equal("verify.error", root.GetProperty("firstFailingReading").GetString());
        Assert.Equal("pass", root.GetProperty("readings")[0].GetProperty("verdict").GetString());
        // Trim keys are names from the sequence and are kept as written.
        Assert.True(root.GetProperty("trim").GetProperty("values").TryGetProperty("gainCode", out _));
        // Absent values are written as null so every stored run has the same shape.
        Assert.Equal(JsonValueKind.Null, root.GetProperty("readings")[0].GetProperty("setpoint").ValueKind);
    }

    [Fact]
    public void Deserialize_SerializedRun_GivesAnEqualRun()
    {
        var run = new RunRecordBuilder().Erroring("reference readout did not answer").WithOperator(null).Build();

        RunAssert.Equal(run, RunJson.Deserialize(RunJson.Serialize(run)));
    }

    [Fact]
    public void Serialize_SameRunTwice_GivesTheSameText()
    {
        // The hash chain covers the stored text; the text of one run must not depend on anything but the run.
        var run = new RunRecordBuilder().Build();

        Assert.Equal(RunJson.Serialize(run), RunJson.Serialize(run with { }));
    }

    [Fact]
    public void Serialize_NonFiniteValues_RoundTrip()
    {
        var run = new RunRecordBuilder().WithReadings(
            new Reading("a", double.NaN, "V", double.NegativeInfinity, double.PositiveInfinity, Verdict.Error)).Build();

        var back = RunJson.Deserialize(RunJson.Serialize(run)).Readings[0];

        Assert.True(double.IsNaN(back.Value!.Value));
        Assert.Equal(double.NegativeInfinity, back.Low);
        Assert.Equal(double.PositiveInfinity, back.High);
    }

    [Fact]
    public void Deserialize_JsonNull_ThrowsJsonException()
    {
        Assert.Throws<JsonException>(() => RunJson.Deserialize("null"));
    }
}
