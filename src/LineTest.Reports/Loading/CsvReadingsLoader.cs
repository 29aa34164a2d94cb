using System.Globalization;
using CsvHelper;
using CsvHelper.Configuration;
using LineTest.Core.Decisions;
using LineTest.Core.Results;

namespace LineTest.Reports.Loading;

/// <summary>
/// Reads report data from a readings CSV: a header row with the columns <c>serial</c>, <c>name</c>,
/// <c>value</c>, <c>unit</c>, <c>low</c>, <c>high</c> and optionally <c>time</c>, <c>station</c>, <c>slot</c>,
/// <c>lot</c>, <c>operator</c>, <c>verdict</c> (and, as <c>linetest export</c> writes them, <c>run_id</c>, <c>run_verdict</c>,
/// <c>sequence_id</c>, <c>sequence_revision</c>; <c>ended_utc</c> is read as <c>time</c>).
/// </summary>
/// <remarks>
/// One row is one reading. Consecutive rows with the same serial, time, station, slot, lot and run id form one
/// run; a reading name seen again starts a new run (a retest). A run's verdict is <c>run_verdict</c> when given,
/// otherwise the worst reading verdict: the <c>verdict</c> column, or judged from the limits (no value: error;
/// outside the limits: fail; a value on a limit passes). Without a time column the file order is the run order.
/// </remarks>
public static class CsvReadingsLoader
{
    /// <summary>Columns that must be present.</summary>
    public static IReadOnlyList<string> RequiredColumns { get; } = ["serial", "name", "value", "unit", "low", "high"];

    private static readonly Dictionary<string, string> Aliases = new(StringComparer.OrdinalIgnoreCase)
    {
        ["ended_utc"] = "time",
        ["sequence"] = "sequence_id",
        ["revision"] = "sequence_revision",
    };

    private const string NoStation = "(no station)";

    /// <summary>Reads the file at <paramref name="path"/>.</summary>
    public static CsvLoadResult Load(string path, ReportQuery query, bool skipBadRows)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        if (!File.Exists(path))
        {
            return new CsvLoadResult { FileError = $"'{path}' does not exist." };
        }

        using var reader = new StreamReader(path);
        return Load(reader, Path.GetFullPath(path), query, skipBadRows);
    }

    /// <summary>Reads CSV text from <paramref name="reader"/>; <paramref name="source"/> names it in the report.</summary>
    public static CsvLoadResult Load(TextReader reader, string source, ReportQuery query, bool skipBadRows)
    {
        ArgumentNullException.ThrowIfNull(reader);
        ArgumentException.ThrowIfNullOrWhiteSpace(source);
        ArgumentNullException.ThrowIfNull(query);

        var problems = new List<CsvRowProblem>();
        var configuration = new CsvConfiguration(CultureInfo.InvariantCulture)
        {
            HasHeaderRecord = true,
            DetectColumnCountChanges = false,
            MissingFieldFound = null,
            HeaderValidated = null,
            BadDataFound = null,
        };
        using var csv = new CsvReader(reader, configuration);
        try
        {
            if (!csv.Read())
            {
                return new CsvLoadResult { FileError = $"{source} is empty: a header row is needed." };
            }

            csv.ReadHeader();
        }
        catch (CsvHelperException ex)
        {
            return new CsvLoadResult { FileError = $"{source}: the header row cannot be read ({ex.Message.Split('\n')[0].Trim()})." };
        }

        var columns = MapHeader(csv.HeaderRecord ?? []);
        var missing = RequiredColumns.Where(c => !columns.ContainsKey(c)).ToList();
        if (missing.Count > 0)
        {
            return new CsvLoadResult
            {
                FileError = $"{source}: the header row lacks the column(s) {string.Join(", ", missing)}; required are {string.Join(", ", RequiredColumns)}.",
            };
        }

        var unanswerable = UnanswerableFilter(query, columns);
        if (unanswerable is not null)
        {
            return new CsvLoadResult { FileError = $"{source}: {unanswerable}" };
        }

        var data = new ReportData();
        data.AddSource(source);
        data.Runs.HasTimes = columns.ContainsKey("time");
        var builder = new RunBuilder(data, query);

        // The same filter the database loader hands to SQL, applied to each row's run columns.
        var filter = query.ToRunFilter();
        var headerCount = csv.HeaderRecord!.Length;
        while (true)
        {
            int line;
            try
            {
                if (!csv.Read())
                {
                    break;
                }

                line = LineOf(csv);
            }
            catch (CsvHelperException ex)
            {
                // A broken quote leaves the parser unable to find where the next record starts.
                problems.Add(new CsvRowProblem(LineOf(csv), $"the file cannot be read past this point ({ex.Message.Split('\n')[0].Trim()})"));
                return Finish(data, builder, problems, skipBadRows);
            }

            if (csv.Parser.Count == 1 && string.IsNullOrWhiteSpace(csv.Parser[0]))
            {
                continue;
            }

            if (csv.Parser.Count != headerCount)
            {
                problems.Add(new CsvRowProblem(line, $"has {csv.Parser.Count} fields but the header has {headerCount}"));
                continue;
            }

            var parsed = ParseRow(csv, columns, out var reason);
            if (parsed is null)
            {
                problems.Add(new CsvRowProblem(line, reason!));
                continue;
            }

            var row = parsed.Value;
            if (filter.Matches(row.Time, row.Station, row.Slot, row.Lot, row.SequenceId, row.Revision, row.Serial))
            {
                builder.Add(row);
            }
        }

        return Finish(data, builder, problems, skipBadRows);
    }

    private static CsvLoadResult Finish(ReportData data, RunBuilder builder, List<CsvRowProblem> problems, bool skipBadRows)
    {
        builder.Flush();
        if (problems.Count > 0 && !skipBadRows)
        {
            return new CsvLoadResult { BadRows = problems };
        }

        return new CsvLoadResult { Data = data, BadRows = problems };
    }

    // CsvHelper counts physical lines read so far; the record just read ends on that line.
    private static int LineOf(CsvReader csv) => csv.Parser.RawRow;

    private static Dictionary<string, int> MapHeader(string[] header)
    {
        var columns = new Dictionary<string, int>(StringComparer.OrdinalIgnoreCase);
        for (var i = 0; i < header.Length; i++)
        {
            var name = header[i].Trim();
            if (Aliases.TryGetValue(name, out var canonical))
            {
                name = canonical;
            }

            columns.TryAdd(name.ToLowerInvariant(), i);
        }

        return columns;
    }

    private static string? UnanswerableFilter(ReportQuery query, Dictionary<string, int> columns)
    {
        var needs = new List<(bool Asked, string Option, string Column)>
        {
            (query.FromUtc.HasValue || query.ToUtc.HasValue || query.GroupBy is ReportGrouping.Day or ReportGrouping.Shift, "--from, --to, --by day and --by shift", "time"),
            (query.GroupBy == ReportGrouping.Operator, "--by operator", "operator"),
            (query.Station is not null || query.GroupBy == ReportGrouping.Station, "--station and --by station", "station"),
            (query.Slot.HasValue || query.GroupBy == ReportGrouping.Slot, "--slot and --by slot", "slot"),
            (query.Lot is not null || query.GroupBy == ReportGrouping.Lot, "--lot and --by lot", "lot"),
            (query.SequenceId is not null, "--sequence", "sequence_id"),
            (query.SequenceRevision.HasValue || query.GroupBy == ReportGrouping.Revision, "--revision and --by revision", "sequence_revision"),
        };
        foreach (var (asked, option, column) in needs)
        {
            if (asked && !columns.ContainsKey(column))
            {
                return $"{option} need a '{column}' column, which the file does not have.";
            }
        }

        return null;
    }

    private static CsvRow? ParseRow(CsvReader csv, Dictionary<string, int> columns, out string? reason)
    {
        reason = null;
        string? Field(string column) => columns.TryGetValue(column, out var i) ? csv.Parser[i]?.Trim() : null;

        var serial = Field("serial");
        if (string.IsNullOrEmpty(serial))
        {
            reason = "serial is empty";
            return null;
        }

        var name = Field("name");
        if (string.IsNullOrEmpty(name))
        {
            reason = "name is empty";
            return null;
        }

        if (!TryNumber(Field("value"), "value", out var value, ref reason)
            || !TryNumber(Field("low"), "low", out var low, ref reason)
            || !TryNumber(Field("high"), "high", out var high, ref reason))
        {
            return null;
        }

        if (low is { } lo && high is { } hi && !(lo < hi))
        {
            reason = string.Create(CultureInfo.InvariantCulture, $"low ({lo}) must be below high ({hi})");
            return null;
        }

        DateTimeOffset? time = null;
        if (columns.ContainsKey("time"))
        {
            var text = Field("time");
            if (!DateTimeOffset.TryParse(text, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal, out var t))
            {
                reason = string.IsNullOrEmpty(text) ? "time is empty" : $"time '{text}' is not a date and time (e.g. 2025-03-04T06:44:30Z)";
                return null;
            }

            time = t;
        }

        var slot = 0;
        var slotText = Field("slot");
        if (!string.IsNullOrEmpty(slotText) && !int.TryParse(slotText, NumberStyles.Integer, CultureInfo.InvariantCulture, out slot))
        {
            reason = $"slot '{slotText}' is not a whole number";
            return null;
        }

        int? revision = null;
        var revisionText = Field("sequence_revision");
        if (!string.IsNullOrEmpty(revisionText))
        {
            if (!int.TryParse(revisionText, NumberStyles.Integer, CultureInfo.InvariantCulture, out var r))
            {
                reason = $"sequence_revision '{revisionText}' is not a whole number";
                return null;
            }

            revision = r;
        }

        if (!TryVerdict(Field("verdict"), "verdict", out var verdict, ref reason)
            || !TryVerdict(Field("run_verdict"), "run_verdict", out var runVerdict, ref reason))
        {
            return null;
        }

        var station = Field("station");
        return new CsvRow(
            serial,
            name,
            value,
            Field("unit") ?? string.Empty,
            low,
            high,
            time,
            string.IsNullOrEmpty(station) ? NoStation : station,
            slot,
            NullIfEmpty(Field("lot")),
            NullIfEmpty(Field("sequence_id")),
            revision,
            verdict,
            runVerdict,
            NullIfEmpty(Field("run_id")),
            NullIfEmpty(Field("operator")));
    }

    private static string? NullIfEmpty(string? text) => string.IsNullOrEmpty(text) ? null : text;

    private static bool TryNumber(string? text, string column, out double? number, ref string? reason)
    {
        number = null;
        if (string.IsNullOrEmpty(text))
        {
            return true;
        }

        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) && double.IsFinite(v))
        {
            number = v;
            return true;
        }

        reason = $"{column} '{text}' is not a number (use a point as the decimal separator)";
        return false;
    }

    private static bool TryVerdict(string? text, string column, out Verdict? verdict, ref string? reason)
    {
        verdict = null;
        if (string.IsNullOrEmpty(text))
        {
            return true;
        }

        verdict = VerdictExtensions.ParseWord(text);
        if (verdict is null)
        {
            reason = $"{column} '{text}' is not pass, fail or error";
            return false;
        }

        return true;
    }

    private readonly record struct CsvRow(
        string Serial,
        string Name,
        double? Value,
        string Unit,
        double? Low,
        double? High,
        DateTimeOffset? Time,
        string Station,
        int Slot,
        string? Lot,
        string? SequenceId,
        int? Revision,
        Verdict? Verdict,
        Verdict? RunVerdict,
        string? RunId,
        string? Operator)
    {
        public bool SameRunAs(CsvRow other) =>
            string.Equals(Serial, other.Serial, StringComparison.Ordinal)
            && Time == other.Time
            && string.Equals(Station, other.Station, StringComparison.Ordinal)
            && Slot == other.Slot
            && string.Equals(Lot, other.Lot, StringComparison.Ordinal)
            && string.Equals(RunId, other.RunId, StringComparison.Ordinal);

        /// <summary>The row's verdict as given, or judged by the station's own rule (simple acceptance, ILAC G8).</summary>
        public Verdict Judged() =>
            Verdict ?? Acceptance.Decide(Value, new LimitSpec { Low = Low, High = High, Unit = Unit }).Verdict;
    }

    /// <summary>Collects the rows of the current run and adds the run when the next one starts.</summary>
    private sealed class RunBuilder(ReportData data, ReportQuery query)
    {
        private readonly List<CsvRow> _rows = [];
        private readonly HashSet<string> _names = new(StringComparer.Ordinal);

        public void Add(CsvRow row)
        {
            if (_rows.Count > 0 && (!row.SameRunAs(_rows[0]) || _names.Contains(row.Name)))
            {
                Flush();
            }

            _rows.Add(row);
            _names.Add(row.Name);
        }

        public void Flush()
        {
            if (_rows.Count == 0)
            {
                return;
            }

            var first = _rows[0];
            var verdict = Verdict.Pass;
            string? failure = null;
            string? error = null;
            foreach (var row in _rows)
            {
                var judged = row.Judged();
                verdict = verdict.Worst(judged);
                if (judged == Verdict.Fail)
                {
                    failure ??= row.Name;
                }
                else if (judged == Verdict.Error)
                {
                    error ??= row.Value is null ? $"reading '{row.Name}' has no value" : $"reading '{row.Name}' ended in error";
                }
            }

            verdict = first.RunVerdict ?? verdict;
            var run = data.Runs.Add(
                first.Serial,
                first.Time ?? DateTimeOffset.UnixEpoch,
                verdict,
                first.Station,
                first.Slot,
                first.Lot,
                first.SequenceId,
                first.Revision,
                failure,
                verdict == Verdict.Error ? error : null);
            data.Runs.SetOperator(run, first.Operator);
            foreach (var row in _rows)
            {
                if (query.WantsReading(row.Name))
                {
                    data.Series(first.SequenceId, row.Name, row.Unit).Add(run, row.Value, row.Unit, row.Low, row.High);
                }
            }

            _rows.Clear();
            _names.Clear();
        }
    }
}
