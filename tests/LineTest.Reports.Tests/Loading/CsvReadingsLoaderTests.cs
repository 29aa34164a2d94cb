using LineTest.Core.Results;
using LineTest.Reports.Loading;

namespace LineTest.Reports.Tests.Loading;

public sealed class CsvReadingsLoaderTests
{
    private const string WithBadRow =
        "serial,name,value,unit,low,high\n" +
        "A1,offset,5,V,0,10\n" +
        "A1,leak,1,uA,,5\n" +
        "A2,offset,abc,V,0,10\n" +
        "A2,leak,2,uA,,5\n" +
        "A3,offset,11,V,0,10\n" +
        "A3,leak,3,uA,,5\n";

    private static CsvLoadResult Load(string text, bool skip = false, ReportQuery? query = null) =>
        CsvReadingsLoader.Load(new StringReader(text), "test.csv", query ?? ReportQuery.All, skip);

    [Fact]
    public void Load_BadValue_ReportsLineNumberAndNoData()
    {
        var result = Load(WithBadRow);

        Assert.False(result.IsUsable);
        var problem = Assert.Single(result.BadRows);
        Assert.Equal(4, problem.Line);
        Assert.Contains("value 'abc' is not a number", problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_BadRowSkipped_UsesTheRest()
    {
        var result = Load(WithBadRow, skip: true);

        Assert.True(result.IsUsable);
        Assert.Single(result.BadRows);
        var data = result.Data!;
        Assert.Equal(3, data.Runs.Count);
        var offset = data.Readings.Single(r => r.Name == "offset");
        Assert.Equal([5.0, 11.0], offset.Values.ToArray());

        // A3's offset is above its high limit: the run is judged a failure on that reading.
        Assert.Equal(Verdict.Fail, data.Runs.Verdict(2));
        Assert.Equal("offset", data.Runs.Outcome(2).FailureName);
    }

    [Theory]
    [InlineData("A1,offset,5,V,10,0", "low (10) must be below high (0)")]
    [InlineData("A1,offset,5,V,0", "has 5 fields but the header has 6")]
    [InlineData(",offset,5,V,0,10", "serial is empty")]
    [InlineData("A1,offset,5,V,zero,10", "low 'zero' is not a number")]
    public void Load_MalformedRow_SaysWhy(string row, string reason)
    {
        var result = Load("serial,name,value,unit,low,high\nA0,offset,5,V,0,10\n" + row + "\n");

        var problem = Assert.Single(result.BadRows);
        Assert.Equal(3, problem.Line);
        Assert.Contains(reason, problem.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_MissingColumn_IsAFileError()
    {
        var result = Load("serial,name,value,unit,low\nA1,offset,5,V,0\n");

        Assert.False(result.IsUsable);
        Assert.Contains("high", result.FileError, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_StationFilterWithoutStationColumn_IsAFileError()
    {
        var result = Load(WithBadRow, query: new ReportQuery { Station = "ST-01" });

        Assert.Contains("station", result.FileError, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_RetestOfSameSerial_StartsANewRun()
    {
        const string text =
            "serial,name,value,unit,low,high,time,slot,verdict\n" +
            "B1,offset,12,V,0,10,2025-03-04T06:00:00Z,1,fail\n" +
            "B1,offset,5,V,0,10,2025-03-04T07:00:00Z,1,pass\n" +
            "B2,offset,,V,0,10,2025-03-04T08:00:00Z,2,\n";

        var data = Load(text).Data!;

        Assert.Equal(3, data.Runs.Count);
        Assert.Equal([Verdict.Fail, Verdict.Pass, Verdict.Error], Enumerable.Range(0, 3).Select(data.Runs.Verdict));
        var series = Assert.Single(data.Readings);
        Assert.Equal(1, series.Missing);
        Assert.Equal(2, series.Count);
        Assert.Equal(new DateTimeOffset(2025, 3, 4, 7, 0, 0, TimeSpan.Zero), data.Runs.EndedUtc(1));
    }

    [Fact]
    public void Load_FromFilter_KeepsLaterRowsOnly()
    {
        const string text =
            "serial,name,value,unit,low,high,time\n" +
            "C1,offset,1,V,0,10,2025-03-03T23:00:00Z\n" +
            "C2,offset,2,V,0,10,2025-03-04T01:00:00Z\n";

        var data = Load(text, query: new ReportQuery { FromUtc = new DateTimeOffset(2025, 3, 4, 0, 0, 0, TimeSpan.Zero) }).Data!;

        Assert.Equal("C2", data.Runs.Serial(Assert.Single(Enumerable.Range(0, data.Runs.Count))));
    }
}
