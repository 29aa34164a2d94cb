using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class ReferenceSensorResultTests
{
    [Fact]
    public void Success_HasSensorAndNoErrors()
    {
        var result = ReferenceSensorResult.Success(CelsiusReadout.Instance);

        Assert.True(result.IsSuccess);
        Assert.Empty(result.Errors);
    }

    [Fact]
    public void Failure_HasErrorsAndNoSensor()
    {
        var result = ReferenceSensorResult.Failure(["r0: required"]);

        Assert.False(result.IsSuccess);
        Assert.Null(result.Sensor);
        Assert.Equal(["r0: required"], result.Errors);
    }

    [Fact]
    public void Failure_WithoutMessages_Throws()
    {
        Assert.Throws<ArgumentException>(() => ReferenceSensorResult.Failure([]));
    }
}
