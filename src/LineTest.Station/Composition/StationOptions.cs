namespace LineTest.Station.Composition;

/// <summary>
/// The <c>Station</c> section of appsettings.json. Relative paths are resolved against the folder that holds
/// appsettings.json.
/// </summary>
public sealed class StationOptions
{
    /// <summary>Configuration section name.</summary>
    public const string Section = "Station";

    /// <summary>Station id stored with every run. Default <c>ST-01</c>.</summary>
    public string Id { get; set; } = "ST-01";

    /// <summary>Fixture file. Default: the simulated four-well dry block.</summary>
    public string Fixture { get; set; } = "fixtures/sim-dryblock-4.json";

    /// <summary>Sequence file. Default: the analog CTP-40A sequence.</summary>
    public string Sequence { get; set; } = "sequences/ctp40a-dac.json";

    /// <summary>Results folder (holds results.db). Default <c>results</c>.</summary>
    public string Results { get; set; } = "results";

    /// <summary><c>engineering</c> (default) or <c>production</c>.</summary>
    public string Mode { get; set; } = "engineering";

    /// <summary>Operator name or badge shown and stored, if known.</summary>
    public string? Operator { get; set; }

    /// <summary>Production lot, if known.</summary>
    public string? Lot { get; set; }

    /// <summary>Seed of the simulator when the fixture is simulated. Default 4040.</summary>
    public int SimulatorSeed { get; set; } = 4040;

    /// <summary>How many times faster than real time the simulator runs under <c>linetest run</c>. Default 60.</summary>
    public double SimulatorSpeed { get; set; } = 60;

    /// <summary>
    /// The factory's shifts for <c>linetest report --by shift</c>: name → start time of day in UTC (HH:mm), e.g.
    /// <c>{"early": "06:00", "late": "14:00", "night": "22:00"}</c> (the default when empty). A shift lasts until the
    /// next one starts. The one shift setting: the live page's "this shift" uses it too (read by
    /// <c>LineTest.Web.Hosting.ShiftSettings</c>, which also accepts the older <c>Station:Web:ShiftStartsUtc</c>).
    /// </summary>
    public Dictionary<string, string> Shifts { get; set; } = [];

    /// <summary>Every problem with these options, in one list (empty when valid).</summary>
    public IReadOnlyList<string> Validate()
    {
        var problems = new List<string>();
        if (string.IsNullOrWhiteSpace(Id))
        {
            problems.Add("Station:Id must not be empty");
        }

        if (string.IsNullOrWhiteSpace(Fixture))
        {
            problems.Add("Station:Fixture must name a fixture file");
        }

        if (string.IsNullOrWhiteSpace(Sequence))
        {
            problems.Add("Station:Sequence must name a sequence file");
        }

        if (string.IsNullOrWhiteSpace(Results))
        {
            problems.Add("Station:Results must name a folder");
        }

        if (Mode is not ("engineering" or "production"))
        {
            problems.Add($"Station:Mode must be 'engineering' or 'production', not '{Mode}'");
        }

        if (!(SimulatorSpeed > 0))
        {
            problems.Add("Station:SimulatorSpeed must be positive");
        }

        return problems;
    }
}
