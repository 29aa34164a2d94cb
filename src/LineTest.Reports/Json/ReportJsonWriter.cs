using System.Text.Encodings.Web;
using System.Text.Json;
using LineTest.Core.Statistics;
using LineTest.Reports.Building;
using LineTest.Reports.Loading;

namespace LineTest.Reports.Json;

/// <summary>
/// Writes a report as one JSON object (shape in docs/report-json.md). A value that is not defined is written
/// as an explicit <c>null</c>, never left out and never 0, so a consumer sees the same keys every time.
/// </summary>
public static class ReportJsonWriter
{
    /// <summary>Top-level keys, in order.</summary>
    public static IReadOnlyList<string> TopLevelKeys { get; } =
        ["title", "generatedUtc", "sources", "filters", "yield", "pareto", "errors", "readings", "slots", "groups", "dailyYield", "skippedRows", "signalLegend"];

    /// <summary>Writes the report to <paramref name="stream"/> (UTF-8, indented).</summary>
    public static void Write(QualityReport report, Stream stream)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(stream);
        using var json = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping });
        json.WriteStartObject();
        json.WriteString("title", report.Title);
        json.WriteString("generatedUtc", report.GeneratedUtc.UtcDateTime.ToString("yyyy-MM-ddTHH:mm:ssZ", System.Globalization.CultureInfo.InvariantCulture));
        json.WriteStartArray("sources");
        foreach (var source in report.Sources)
        {
            json.WriteStringValue(source);
        }

        json.WriteEndArray();
        WriteFilters(json, report.Query);
        json.WritePropertyName("yield");
        WriteYield(json, report.Yield);
        json.WriteStartArray("pareto");
        foreach (var bar in report.Yield.FailurePareto)
        {
            json.WriteStartObject();
            json.WriteString("name", bar.Name);
            json.WriteNumber("failures", bar.Count);
            json.WriteNumber("fraction", bar.Fraction);
            json.WriteNumber("cumulativeFraction", bar.CumulativeFraction);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteStartArray("errors");
        foreach (var bar in report.Yield.ErrorReasons)
        {
            json.WriteStartObject();
            json.WriteString("reason", bar.Name);
            json.WriteNumber("runs", bar.Count);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteStartArray("readings");
        foreach (var reading in report.Readings)
        {
            WriteReading(json, reading);
            Spill(json);
        }

        json.WriteEndArray();
        json.WriteStartArray("slots");
        foreach (var entry in report.Slots)
        {
            WriteSlots(json, entry);
        }

        json.WriteEndArray();
        WriteGroups(json, report);
        json.WriteStartArray("dailyYield");
        foreach (var day in report.DailyYield)
        {
            json.WriteStartObject();
            json.WriteString("day", day.Day);
            json.WriteNumber("runs", day.Runs);
            Number(json, "firstPassYield", day.FirstPassYield);
            Number(json, "finalYield", day.FinalYield);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteStartArray("skippedRows");
        foreach (var row in report.SkippedRows)
        {
            json.WriteStringValue(row);
        }

        json.WriteEndArray();
        json.WriteStartObject("signalLegend");
        foreach (var (label, rule) in SignalLabels.Legend)
        {
            json.WriteString(label, rule);
        }

        json.WriteEndObject();
        json.WriteEndObject();
        json.Flush();
    }

    /// <summary>The report as a JSON string.</summary>
    /// <summary>
    /// Writes the report to <paramref name="writer"/> as it is produced, the same text as <see cref="ToJson"/>: a report
    /// of millions of values is never held whole as bytes and again as a string.
    /// </summary>
    public static void Write(QualityReport report, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(writer);
        using var stream = new TextWriterStream(writer);
        Write(report, stream);
    }

    public static string ToJson(QualityReport report)
    {
        using var stream = new MemoryStream();
        Write(report, stream);
        return System.Text.Encoding.UTF8.GetString(stream.ToArray());
    }

    /// <summary>Passes what is written on to the stream every 64 KiB, so a large report is never buffered whole.</summary>
    private static void Spill(Utf8JsonWriter json)
    {
        if (json.BytesPending >= 1 << 16)
        {
            json.Flush();
        }
    }

    private static void WriteFilters(Utf8JsonWriter json, ReportQuery q)
    {
        json.WriteStartObject("filters");
        Text(json, "from", q.FromUtc?.UtcDateTime.ToString("yyyy-MM-ddTHH:mm:ssZ", System.Globalization.CultureInfo.InvariantCulture));
        Text(json, "to", q.ToUtc?.UtcDateTime.ToString("yyyy-MM-ddTHH:mm:ssZ", System.Globalization.CultureInfo.InvariantCulture));
        Text(json, "station", q.Station);
        Integer(json, "slot", q.Slot);
        Text(json, "lot", q.Lot);
        Text(json, "sequence", q.SequenceId);
        Integer(json, "revision", q.SequenceRevision);
        json.WriteStartArray("readings");
        foreach (var name in q.ReadingNames)
        {
            json.WriteStringValue(name);
        }

        json.WriteEndArray();
        Text(json, "by", q.GroupBy == ReportGrouping.None ? null : q.GroupBy.ToString().ToLowerInvariant());
        json.WriteString("description", q.Describe());
        json.WriteEndObject();
    }

    private static void WriteYield(Utf8JsonWriter json, YieldSummary y)
    {
        json.WriteStartObject();
        json.WriteNumber("runs", y.Runs);
        json.WriteNumber("units", y.Units);
        Number(json, "firstPassYield", y.FirstPassYield);
        Number(json, "finalYield", y.FinalYield);
        Number(json, "retestRate", y.RetestRate);
        Number(json, "errorRate", y.ErrorRate);
        json.WriteNumber("passRuns", y.PassRuns);
        json.WriteNumber("failRuns", y.FailRuns);
        json.WriteNumber("errorRuns", y.ErrorRuns);
        json.WriteEndObject();
    }

    private static void WriteReading(Utf8JsonWriter json, ReadingStatistics r)
    {
        var c = r.Capability;
        json.WriteStartObject();
        json.WriteString("name", r.Name);
        json.WriteString("unit", r.Unit);
        Number(json, "low", r.Low);
        Number(json, "high", r.High);
        json.WriteBoolean("limitsChanged", r.LimitsChanged);
        json.WriteNumber("n", r.Count);
        json.WriteNumber("missing", r.Missing);
        Number(json, "mean", c.Mean);
        Number(json, "stdevOverall", c.StdDevOverall);
        Number(json, "stdevWithin", c.StdDevWithin);
        Number(json, "cp", c.Cp);
        Number(json, "cpLower95", c.CpInterval?.Lower);
        Number(json, "cpUpper95", c.CpInterval?.Upper);
        Number(json, "cpk", c.Cpk);
        Number(json, "cpkLower95", c.CpkInterval?.Lower);
        Number(json, "cpkUpper95", c.CpkInterval?.Upper);
        Number(json, "pp", c.Pp);
        Number(json, "ppk", c.Ppk);
        Number(json, "ppmObserved", c.ObservedPpmTotal);
        Number(json, "ppmExpected", c.ExpectedPpmTotal);
        Number(json, "adStatistic", r.Normality?.AStarSquared);
        Number(json, "normalityP", r.Normality?.PValue);
        Text(json, "sequence", r.SequenceId);
        json.WriteString("covers", r.Covers);
        json.WriteBoolean("nonNormal", r.NonNormal);
        Number(json, "withinDf", c.WithinDegreesOfFreedom);
        if (r.Percentile is { } pct)
        {
            json.WriteStartObject("percentile");
            json.WriteNumber("p00135", pct.Lower);
            json.WriteNumber("median", pct.Median);
            json.WriteNumber("p99865", pct.Upper);
            Number(json, "pp", pct.Pp);
            Number(json, "ppk", pct.Ppk);
            json.WriteBoolean("extremesInterpolated", pct.ExtremesInterpolated);
            json.WriteEndObject();
        }
        else
        {
            json.WriteNull("percentile");
        }
        if (r.Chart is { } chart)
        {
            json.WriteStartObject("controlLimits");
            json.WriteNumber("centre", chart.Centre);
            json.WriteNumber("lower", chart.LowerControlLimit);
            json.WriteNumber("upper", chart.UpperControlLimit);
            json.WriteNumber("movingRangeUpper", chart.MovingRangeUpperLimit);
            json.WriteEndObject();
        }
        else
        {
            json.WriteNull("controlLimits");
        }

        json.WriteStartArray("signals");
        foreach (var s in r.Chart?.Signals ?? [])
        {
            json.WriteStartObject();
            json.WriteString("rule", SignalLabels.Label(s));
            json.WriteNumber("index", s.Index);
            json.WriteNumber("first", s.Points.Count > 0 ? s.Points[0] : s.Index);
            json.WriteNumber("last", s.Points.Count > 0 ? s.Points[^1] : s.Index);
            json.WriteNumber("points", s.Points.Count);
            json.WriteString("description", s.Description);
            json.WriteEndObject();
            Spill(json);
        }

        json.WriteEndArray();
        json.WriteStartArray("notes");
        foreach (var note in Notes(r))
        {
            json.WriteStringValue(note);
        }

        json.WriteEndArray();
        json.WriteEndObject();
    }

    /// <summary>Every note on a reading: why a value is null, changed limits.</summary>
    internal static IEnumerable<string> Notes(ReadingStatistics r)
    {
        if (r.LimitsChanged)
        {
            yield return "The limits or the unit changed within the data; the latest are used.";
        }

        foreach (var note in r.Capability.Notes)
        {
            yield return note;
        }

        if (r.NormalityNote is not null)
        {
            yield return r.NormalityNote;
        }

        if (r.NonNormal)
        {
            yield return "Not normal (Anderson–Darling p < 0.05): the normal-based indices and expected ppm are not to be trusted; read the percentile Ppk (ISO 22514-2 percentile method).";
        }

        if (r.Percentile is { ExtremesInterpolated: true })
        {
            yield return "Percentile capability from fewer than 741 values: the 0.135 % and 99.865 % points lie at the sample's edge, so it reads high.";
        }

        if (r.HasLimits && r.PercentileNote is not null)
        {
            yield return r.PercentileNote;
        }

        if (r.ChartNote is not null)
        {
            yield return r.ChartNote;
        }
    }

    private static void WriteSlots(Utf8JsonWriter json, SlotBiasEntry entry)
    {
        json.WriteStartObject();
        json.WriteString("name", entry.Name);
        Text(json, "sequence", entry.SequenceId);
        json.WriteString("unit", entry.Unit);
        var r = entry.Result;
        Number(json, "f", r?.FStatistic);
        Number(json, "p", r?.PValue);
        Integer(json, "dfBetween", r?.DegreesOfFreedomBetween);
        Integer(json, "dfWithin", r?.DegreesOfFreedomWithin);
        Number(json, "grandMean", r?.GrandMean);
        json.WriteStartArray("offsets");
        foreach (var g in r?.Groups ?? [])
        {
            json.WriteStartObject();
            json.WriteNumber("slot", g.Slot);
            json.WriteNumber("n", g.Count);
            json.WriteNumber("mean", g.Mean);
            json.WriteNumber("offset", g.OffsetFromGrandMean);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        Text(json, "note", entry.Reason);
        json.WriteEndObject();
    }

    private static void WriteGroups(Utf8JsonWriter json, QualityReport report)
    {
        if (report.Query.GroupBy == ReportGrouping.None)
        {
            json.WriteNull("groups");
            return;
        }

        json.WriteStartObject("groups");
        json.WriteString("by", report.Query.GroupBy.ToString().ToLowerInvariant());
        json.WriteStartArray("items");
        foreach (var group in report.Groups)
        {
            json.WriteStartObject();
            json.WriteString("key", group.Key);
            json.WritePropertyName("yield");
            WriteYield(json, group.Yield);
            json.WriteStartArray("readings");
            foreach (var r in group.Readings)
            {
                json.WriteStartObject();
                json.WriteString("name", r.Name);
                Text(json, "sequence", r.SequenceId);
                json.WriteNumber("n", r.Count);
                Number(json, "mean", r.Mean);
                Number(json, "stdevOverall", r.StdDevOverall);
                Number(json, "stdevWithin", r.StdDevWithin);
                Number(json, "cpk", r.Cpk);
                Number(json, "ppk", r.Ppk);
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void Number(Utf8JsonWriter json, string name, double? value)
    {
        if (value is { } v && double.IsFinite(v))
        {
            json.WriteNumber(name, v);
        }
        else
        {
            json.WriteNull(name);
        }
    }

    private static void Integer(Utf8JsonWriter json, string name, int? value)
    {
        if (value is { } v)
        {
            json.WriteNumber(name, v);
        }
        else
        {
            json.WriteNull(name);
        }
    }

    private static void Text(Utf8JsonWriter json, string name, string? value)
    {
        if (value is null)
        {
            json.WriteNull(name);
        }
        else
        {
            json.WriteString(name, value);
        }
    }

    /// <summary>A write-only stream that decodes the UTF-8 written to it into a text writer (a sequence split between two writes included).</summary>
    private sealed class TextWriterStream(TextWriter writer) : Stream
    {
        private readonly System.Text.Decoder _decoder = new System.Text.UTF8Encoding(false, throwOnInvalidBytes: true).GetDecoder();
        private char[] _chars = new char[4096];

        public override bool CanRead => false;

        public override bool CanSeek => false;

        public override bool CanWrite => true;

        public override long Length => throw new NotSupportedException();

        public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }

        public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));

        public override void Write(ReadOnlySpan<byte> buffer)
        {
            var needed = _decoder.GetCharCount(buffer, flush: false);
            if (needed > _chars.Length)
            {
                _chars = new char[Math.Max(needed, _chars.Length * 2)];
            }

            var written = _decoder.GetChars(buffer, _chars, flush: false);
            writer.Write(_chars, 0, written);
        }

        public override void Flush() => writer.Flush();

        public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException();

        public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

        public override void SetLength(long value) => throw new NotSupportedException();
    }
}
