using System.Globalization;
using CsvHelper;
using LineTest.Reports.Building;
using LineTest.Reports.Csv;
using LineTest.Reports.Loading;
using LineTest.Reports.Tests.Support;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Reports.Tests.Csv;

public sealed class ReadingStatisticsCsvWriterTests
{
    [Fact]
    public async Task Write_SmallLine_OneRowPerReadingWithEmptyFieldsForUndefined()
    {
        var directory = await SmallLine.CreateAsync();
        var report = ReportBuilder.Build(await ResultsLoader.LoadAsync([directory], ReportQuery.All), ReportQuery.All, new FakeTimeProvider());
        var writer = new StringWriter(CultureInfo.InvariantCulture);

        ReadingStatisticsCsvWriter.Write(report, writer);

        var text = writer.ToString();
        Assert.Contains("\r\n", text, StringComparison.Ordinal);
        using var csv = new CsvReader(new StringReader(text), CultureInfo.InvariantCulture);
        csv.Read();
        csv.ReadHeader();
        Assert.Equal(ReadingStatisticsCsvWriter.Header, csv.HeaderRecord);
        var rows = new Dictionary<string, (string Cp, string Cpk, string N, string Mean)>();
        while (csv.Read())
        {
            rows[csv.GetField("name")!] = (csv.GetField("cp")!, csv.GetField("cpk")!, csv.GetField("n")!, csv.GetField("mean")!);
        }

        Assert.Equal(["offset", "leak", "slope"], rows.Keys);
        Assert.Equal(string.Empty, rows["leak"].Cp);
        Assert.NotEqual(string.Empty, rows["leak"].Cpk);
        Assert.Equal(string.Empty, rows["slope"].Cpk);
        Assert.Equal("6", rows["slope"].N);

        // Invariant culture, round trip: 5.0333… is written with a point and parses back exactly.
        Assert.Equal((4.0 + 5.5 + 6.1 + 3.2 + 7.0 + 4.4) / 6, double.Parse(rows["offset"].Mean, CultureInfo.InvariantCulture), 14);
    }
}
