using LineTest.Core.Results;

namespace LineTest.Storage.Tests;

/// <summary>Field-by-field equality of runs (records holding lists compare lists by reference).</summary>
internal static class RunAssert
{
    public static void Equal(RunRecord expected, RunRecord actual)
    {
        Assert.Equal(expected.Id, actual.Id);
        Assert.Equal(expected.Serial, actual.Serial);
        Assert.Equal(expected.Product, actual.Product);
        Assert.Equal(expected.SequenceId, actual.SequenceId);
        Assert.Equal(expected.SequenceRevision, actual.SequenceRevision);
        Assert.Equal(expected.SequenceSha256, actual.SequenceSha256);
        Assert.Equal(expected.Station, actual.Station);
        Assert.Equal(expected.Fixture, actual.Fixture);
        Assert.Equal(expected.Slot, actual.Slot);
        Assert.Equal(expected.Operator, actual.Operator);
        Assert.Equal(expected.Lot, actual.Lot);
        Assert.Equal(expected.BatchId, actual.BatchId);
        Assert.Equal(expected.Mode, actual.Mode);
        Assert.Equal(expected.StartedUtc, actual.StartedUtc);
        Assert.Equal(expected.StartedUtc.Offset, actual.StartedUtc.Offset);
        Assert.Equal(expected.EndedUtc, actual.EndedUtc);
        Assert.Equal(expected.Verdict, actual.Verdict);
        Assert.Equal(expected.Reason, actual.Reason);
        Assert.Equal(expected.FirstFailingReading, actual.FirstFailingReading);
        Assert.Equal(expected.Firmware, actual.Firmware);
        // Reading and SetpointRecord hold only values, so record equality compares every field.
        Assert.Equal(expected.Readings, actual.Readings);
        Assert.Equal(expected.Setpoints, actual.Setpoints);
        if (expected.Trim is null)
        {
            Assert.Null(actual.Trim);
            return;
        }

        Assert.NotNull(actual.Trim);
        Assert.Equal(expected.Trim.Method, actual.Trim.Method);
        Assert.Equal(expected.Trim.InRange, actual.Trim.InRange);
        Assert.Equal(expected.Trim.Inputs, actual.Trim.Inputs);
        Assert.Equal(expected.Trim.Values, actual.Trim.Values);
        Assert.Equal(expected.Trim.PredictedErrorC, actual.Trim.PredictedErrorC);
        Assert.Equal(expected.Trim.Instructions, actual.Trim.Instructions);
    }
}
