using LineTest.Reports.Loading;

namespace LineTest.Reports.Tests.Loading;

public sealed class ReadingSeriesTests
{
    [Fact]
    public void EnsureCapacity_BeforeAndBetweenAdds_KeepsValuesRunsAndOrder()
    {
        var series = new ReadingSeries("verify.error", "°C");
        series.Add(0, 0.01, "°C", -0.1, 0.1);
        series.EnsureCapacity(1000);
        series.Add(1, null, "°C", -0.1, 0.1);
        series.Add(2, -0.02, "°C", -0.1, 0.1);
        series.EnsureCapacity(1);

        Assert.Equal([0.01, -0.02], series.Values.ToArray());
        Assert.Equal([0, 2], series.Runs.ToArray());
        Assert.Equal(1, series.Missing);
    }

    [Fact]
    public void EnsureCapacity_Negative_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new ReadingSeries("verify.error", "°C").EnsureCapacity(-1));
    }
}
