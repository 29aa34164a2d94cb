using LineTest.Core.Results;
using LineTest.Factory.Reporting.Packs;

namespace LineTest.Factory.Tests.Reporting.Packs;

public sealed class RunPackTests
{
    [Fact]
    public void FromBytes_WhatToBytesWrote_EveryColumnBack()
    {
        var pack = Sample();

        var back = RunPack.FromBytes(pack.ToBytes());

        Assert.Equal(pack.Chain, back.Chain);
        Assert.Equal(pack.Texts, back.Texts);
        Assert.Equal(pack.EndedTicks, back.EndedTicks);
        Assert.Equal(pack.Seq, back.Seq);
        Assert.Equal(pack.Lot, back.Lot);
        Assert.Equal(pack.Revision, back.Revision);
        Assert.Equal(pack.Verdict, back.Verdict);
        Assert.Equal(pack.Serial, back.Serial);
        Assert.Equal(pack.Shapes, back.Shapes);
        Assert.Equal(pack.ReadingStart, back.ReadingStart);
        Assert.Equal(pack.ReadingShape, back.ReadingShape);
        // NaN (no value), −0 and the extremes come back bit for bit.
        Assert.Equal(pack.ReadingValue.Select(BitConverter.DoubleToInt64Bits), back.ReadingValue.Select(BitConverter.DoubleToInt64Bits));
    }

    [Fact]
    public void FromBytes_EveryTruncationAndEveryByteChanged_PackOrInvalidDataExceptionNothingElse()
    {
        var bytes = Sample().ToBytes();
        for (var length = 0; length < bytes.Length; length++)
        {
            var error = Assert.Throws<InvalidDataException>(() => RunPack.FromBytes(bytes.AsSpan(0, length)));
            Assert.StartsWith("The run pack", error.Message, StringComparison.Ordinal);
        }

        for (var at = 0; at < bytes.Length; at++)
        {
            foreach (var value in new byte[] { 0x00, 0x7F, 0x80, 0xFF })
            {
                var changed = (byte[])bytes.Clone();
                changed[at] = value;
                try
                {
                    var pack = RunPack.FromBytes(changed);
                    // What is read is usable: every run's readings lie within the readings.
                    Assert.Equal(pack.Readings, pack.ReadingStart[pack.Runs]);
                }
                catch (InvalidDataException)
                {
                }
            }
        }
    }

    private static RunPack Sample() => new()
    {
        Chain = Guid.Parse("6f1c2d3e-4b5a-4c6d-8e7f-0123456789ab"),
        Texts = ["ST-01", "LOT-A", "ctp40a-dac", "CTP-40A", "OP-1", "verify.error", "verify.error outside limits", "V", "Ω·°C"],
        EndedTicks = [638_800_000_000_000_000, 638_800_000_000_000_001, 638_800_000_000_000_001],
        Seq = [3, 5, 9],
        Station = [0, 0, 0],
        Slot = [1, 2, 4],
        Lot = [1, -1, 1],
        Sequence = [2, 2, 2],
        Revision = [3, int.MinValue, 4],
        Product = [3, 3, 3],
        Operator = [4, -1, -1],
        Failure = [-1, 5, -1],
        Reason = [-1, 6, -1],
        Verdict = [Verdict.Pass, Verdict.Fail, Verdict.Error],
        Serial = ["CTP40-00001", "CTP40-00002", "CTP40-ÄÖ-3"],
        Shapes = [new PackShape(5, 7, -0.5, 0.5), new PackShape(8, 8, null, null)],
        ReadingStart = [0, 2, 4, 4],
        ReadingShape = [0, 1, 0, 1],
        ReadingValue = [0.125, double.NaN, -0.0, double.MaxValue],
    };
}
