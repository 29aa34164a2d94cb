using System.Globalization;
using CsvHelper;
using LineTest.Core.Results;
using LineTest.Storage.Csv;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Storage.Tests.Csv;

public sealed class CsvResultExporterTests
{
    private const string AwkwardReason = "verify.error 0.31 degC > 0.25, limit \"check\"\r\nsecond line";

    [Fact]
    public async Task ExportRunsAsync_AwkwardText_RoundTripsThroughCsvHelper()
    {
        var (directory, runs) = await StoreAwkwardRuns();
        var exporter = new CsvResultExporter(SqliteResultReader.InDirectory(directory));
        using var text = new StringWriter(CultureInfo.InvariantCulture);

        var count = await exporter.ExportRunsAsync(text);

        Assert.Equal(runs.Count, count);
        var rows = Parse(text.ToString(), out var header);
        Assert.Equal(CsvResultExporter.RunHeader, header);
        Assert.Equal(runs.Count, rows.Count);
        for (var i = 0; i < runs.Count; i++)
        {
            Assert.Equal((i + 1).ToString(CultureInfo.InvariantCulture), rows[i]["seq"]);
            Assert.Equal(runs[i].Id.ToString("D"), rows[i]["id"]);
            Assert.Equal(runs[i].Serial, rows[i]["serial"]);
            Assert.Equal(runs[i].Verdict.ToWord(), rows[i]["verdict"]);
            Assert.Equal(runs[i].Reason ?? string.Empty, rows[i]["reason"]);
            Assert.Equal(runs[i].Lot ?? string.Empty, rows[i]["lot"]);
            Assert.Equal(UtcText.ToText(runs[i].EndedUtc), rows[i]["ended_utc"]);
            Assert.Equal(runs[i].Slot.ToString(CultureInfo.InvariantCulture), rows[i]["slot"]);
        }
    }

    [Fact]
    public async Task ExportRunsAsync_FieldWithQuoteCommaAndNewline_IsQuotedPerRfc4180()
    {
        var (directory, _) = await StoreAwkwardRuns();
        using var text = new StringWriter(CultureInfo.InvariantCulture);

        await new CsvResultExporter(SqliteResultReader.InDirectory(directory)).ExportRunsAsync(text);

        // RFC 4180 §2.6-2.7: fields with commas, quotes or line breaks are enclosed in quotes and quotes are doubled.
        Assert.Contains("\"verify.error 0.31 degC > 0.25, limit \"\"check\"\"\r\nsecond line\"", text.ToString(), StringComparison.Ordinal);
        // RFC 4180 §2.1: records end with CRLF.
        Assert.StartsWith(string.Join(",", CsvResultExporter.RunHeader) + "\r\n", text.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task ExportReadingsAsync_Filtered_RoundTripsValuesExactly()
    {
        var (directory, runs) = await StoreAwkwardRuns();
        using var text = new StringWriter(CultureInfo.InvariantCulture);
        var filter = new RunFilter { ReadingNames = ["cold.output", "odd,name"] };

        var count = await new CsvResultExporter(SqliteResultReader.InDirectory(directory)).ExportReadingsAsync(text, filter);

        var rows = Parse(text.ToString(), out var header);
        Assert.Equal(CsvResultExporter.ReadingHeader, header);
        var expected = runs
            .SelectMany(run => run.Readings.Select((reading, ordinal) => (run, reading, ordinal)))
            .Where(x => x.reading.Name is "cold.output" or "odd,name")
            .ToList();
        Assert.Equal(expected.Count, count);
        Assert.Equal(expected.Count, rows.Count);
        for (var i = 0; i < rows.Count; i++)
        {
            var (run, reading, ordinal) = expected[i];
            Assert.Equal(run.Id.ToString("D"), rows[i]["run_id"]);
            Assert.Equal(run.Serial, rows[i]["serial"]);
            Assert.Equal(ordinal.ToString(CultureInfo.InvariantCulture), rows[i]["ordinal"]);
            Assert.Equal(reading.Name, rows[i]["name"]);
            Assert.Equal(reading.Value, Number(rows[i]["value"]));
            Assert.Equal(reading.Low, Number(rows[i]["low"]));
            Assert.Equal(reading.High, Number(rows[i]["high"]));
            Assert.Equal(reading.Note ?? string.Empty, rows[i]["note"]);
            Assert.Equal(reading.Verdict.ToWord(), rows[i]["verdict"]);
        }
    }

    [Fact]
    public async Task ExportRunsAsync_NoMatchingRun_WritesOnlyTheHeader()
    {
        var (directory, _) = await StoreAwkwardRuns();
        using var text = new StringWriter(CultureInfo.InvariantCulture);

        var count = await new CsvResultExporter(SqliteResultReader.InDirectory(directory)).ExportRunsAsync(text, new RunFilter { Station = "nowhere" });

        Assert.Equal(0, count);
        Assert.Equal(string.Join(",", CsvResultExporter.RunHeader) + "\r\n", text.ToString());
    }

    private static async Task<(string Directory, List<RunRecord> Runs)> StoreAwkwardRuns()
    {
        var directory = Some.TempDirectory();
        var awkwardReading = new Reading("odd,name", 1.0 / 3.0, "V", -1e-9, 12345.678901234567, Verdict.Pass)
        {
            Note = "said \"ok\",\nthen stopped",
        };
        var runs = new List<RunRecord>
        {
            new RunRecordBuilder().Failing("verify.error", AwkwardReason).WithLot("LOT \"7\", east").Build(),
            new RunRecordBuilder().WithSerial("CTP40,\"QUOTED\"").WithLot(null).Build(),
            new RunRecordBuilder().WithReadings(
                new Reading("cold.output", 0.1 + 0.2, "V", 0.25, 0.35, Verdict.Pass),
                awkwardReading,
                new Reading("cold.output", null, "V", 0.25, 0.35, Verdict.Error) { Note = "unit did not answer" }).Build(),
        };
        await using var store = SqliteResultStore.Open(directory);
        foreach (var run in runs)
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        return (directory, runs);
    }

    private static List<Dictionary<string, string>> Parse(string text, out string[] header)
    {
        using var reader = new StringReader(text);
        using var csv = new CsvReader(reader, CultureInfo.InvariantCulture);
        Assert.True(csv.Read());
        Assert.True(csv.ReadHeader());
        header = csv.HeaderRecord!;
        var rows = new List<Dictionary<string, string>>();
        while (csv.Read())
        {
            var row = new Dictionary<string, string>();
            foreach (var name in header)
            {
                row[name] = csv.GetField(name)!;
            }

            rows.Add(row);
        }

        return rows;
    }

    private static double? Number(string field) => field.Length == 0 ? null : double.Parse(field, NumberStyles.Float, CultureInfo.InvariantCulture);
}
