using LineTest.Core.Fixtures;
using LineTest.Rig.Serial.Rigs;
using LineTest.TestSupport;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Rig.Serial.Tests.Rigs;

public sealed class SerialRigTests
{
    [Fact]
    public void Problems_CommittedRealFixture_None()
    {
        var fixture = DefinitionFile.Fixture(RepoFiles.Path("fixtures/rig-dryblock-4.json"));

        Assert.True(fixture.IsSuccess, string.Join("\n", fixture.Problems));
        Assert.Empty(SerialRig.Problems(fixture.Value!));
    }

    [Fact]
    public void Open_SimulatorFixture_ArgumentExceptionListingEveryMissingPort()
    {
        var fixture = DefinitionFile.Fixture(RepoFiles.Path("fixtures/sim-dryblock-4.json")).Value!;

        var ex = Assert.Throws<ArgumentException>(() => SerialRig.Open(fixture, NullLoggerFactory.Instance));

        Assert.Contains("rig 'simulator', not 'serial'", ex.Message, StringComparison.Ordinal);
        Assert.Contains("$.meter has no serial port", ex.Message, StringComparison.Ordinal);
        Assert.Contains("slot 4 has no serial port", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Open_RealFixture_DriversNamedByTheirPortsWithNothingOpened()
    {
        var fixture = DefinitionFile.Fixture(RepoFiles.Path("fixtures/rig-dryblock-4.json")).Value!;

        using var rig = SerialRig.Open(fixture, NullLoggerFactory.Instance);

        Assert.Equal($"source on {fixture.Source.Port!.Name}", rig.Source.Line.Instrument);
        Assert.Equal(4, rig.Instruments.UnitLinks.Count);
        Assert.Equal(0, rig.Meter.Line.OpenCount);
    }
}
