using LineTest.Core.Results;

namespace LineTest.TestSupport.Builders;

/// <summary>
/// Builds complete, plausible <see cref="RunRecord"/>s for tests: a CTP-40 style run with readings at three
/// setpoints, a DAC trim and the setpoint history. Every field is filled so round trips check them all.
/// </summary>
public sealed class RunRecordBuilder
{
    private static readonly DateTimeOffset DefaultStart = new(2025, 3, 4, 6, 30, 0, TimeSpan.Zero);

    private Guid _id = Guid.NewGuid();
    private string _serial = Some.Serial();
    private string _station = "ST-01";
    private string _fixture = "DB4-A";
    private int _slot = 1;
    private string? _lot = "LOT-2025-031";
    private string _sequenceId = "ctp40a-eol";
    private int _revision = 3;
    private DateTimeOffset _started = DefaultStart;
    private TimeSpan _duration = TimeSpan.FromMinutes(14.5);
    private Verdict _verdict = Verdict.Pass;
    private string? _reason;
    private string? _firstFailing;
    private string? _operator = "badge-0417";
    private List<Reading>? _readings;

    /// <summary>Sets the run id.</summary>
    public RunRecordBuilder WithId(Guid id)
    {
        _id = id;
        return this;
    }

    /// <summary>Sets the serial.</summary>
    public RunRecordBuilder WithSerial(string serial)
    {
        _serial = serial;
        return this;
    }

    /// <summary>Sets the station id.</summary>
    public RunRecordBuilder WithStation(string station)
    {
        _station = station;
        return this;
    }

    /// <summary>Sets the fixture id.</summary>
    public RunRecordBuilder WithFixture(string fixture)
    {
        _fixture = fixture;
        return this;
    }

    /// <summary>Sets the slot.</summary>
    public RunRecordBuilder WithSlot(int slot)
    {
        _slot = slot;
        return this;
    }

    /// <summary>Sets the lot (null for none).</summary>
    public RunRecordBuilder WithLot(string? lot)
    {
        _lot = lot;
        return this;
    }

    /// <summary>Sets the operator (null for none).</summary>
    public RunRecordBuilder WithOperator(string? operatorName)
    {
        _operator = operatorName;
        return this;
    }

    /// <summary>Sets the sequence id and revision.</summary>
    public RunRecordBuilder WithSequence(string sequenceId, int revision)
    {
        _sequenceId = sequenceId;
        _revision = revision;
        return this;
    }

    /// <summary>Sets start and end.</summary>
    public RunRecordBuilder StartedAt(DateTimeOffset started, TimeSpan? duration = null)
    {
        _started = started;
        _duration = duration ?? _duration;
        return this;
    }

    /// <summary>Makes the run fail on the given reading, with a reason.</summary>
    public RunRecordBuilder Failing(string readingName, string reason)
    {
        _verdict = Verdict.Fail;
        _firstFailing = readingName;
        _reason = reason;
        return this;
    }

    /// <summary>Makes the run end in error, with a reason.</summary>
    public RunRecordBuilder Erroring(string reason)
    {
        _verdict = Verdict.Error;
        _reason = reason;
        return this;
    }

    /// <summary>Replaces the readings.</summary>
    public RunRecordBuilder WithReadings(params Reading[] readings)
    {
        _readings = [.. readings];
        return this;
    }

    /// <summary>Builds the run.</summary>
    public RunRecord Build()
    {
        var readings = _readings ?? DefaultReadings();
        if (_firstFailing is not null && _readings is null)
        {
            readings = [.. readings.Select(r => r.Name == _firstFailing ? r with { Value = r.High + 0.1, Verdict = Verdict.Fail } : r)];
        }

        return new RunRecord
        {
            Id = _id,
            Serial = _serial,
            Product = "CTP-40A",
            SequenceId = _sequenceId,
            SequenceRevision = _revision,
            SequenceSha256 = "9f2c4e1d7b3a58c6e0f1a2b3c4d5e6f708192a3b4c5d6e7f8091a2b3c4d5e6f7",
            Station = _station,
            Fixture = _fixture,
            Slot = _slot,
            Operator = _operator,
            Lot = _lot,
            BatchId = "B-" + _started.ToString("yyyyMMdd-HHmm", System.Globalization.CultureInfo.InvariantCulture),
            Mode = "production",
            StartedUtc = _started,
            EndedUtc = _started + _duration,
            Verdict = _verdict,
            Reason = _reason,
            FirstFailingReading = _firstFailing,
            Readings = readings,
            Trim = new TrimRecord(
                "dac",
                new Dictionary<string, double> { ["fit.slopeVoltsPerC"] = -0.002013, ["fit.offsetVolts"] = 0.6952 },
                new Dictionary<string, double> { ["gainCode"] = 2113, ["offsetCode"] = 1987 },
                new Dictionary<string, double> { ["cold"] = 0.012, ["warm"] = -0.008, ["check"] = 0.021 },
                true,
                []),
            Setpoints =
            [
                new SetpointRecord("cold", -20.0, -19.987, 412.5, 180.0, _started.AddSeconds(412.5)),
                new SetpointRecord("warm", 40.0, 40.012, 605.25, 180.0, _started.AddSeconds(1197.75)),
                new SetpointRecord("check", 10.0, null, 900.0, 0.0, null),
            ],
            Firmware = "1.4.2",
        };
    }

    private List<Reading> DefaultReadings() =>
    [
        new("supply.current", 4.213, "mA", 3.5, 5.0, Verdict.Pass) { Step = "power-on", Samples = 10, At = _started.AddSeconds(5) },
        new("cold.output", 0.73571, "V", 0.70, 0.78, Verdict.Pass)
        {
            Step = "read-cold", Setpoint = "cold", StandardUncertainty = 0.0004, ExpandedUncertainty = 0.0008,
            CoverageFactor = 2, DecisionRule = "guarded", AcceptanceLow = 0.7008, AcceptanceHigh = 0.7792, Samples = 20,
        },
        new("warm.output", 0.61498, "V", 0.58, 0.66, Verdict.Pass) { Step = "read-warm", Setpoint = "warm", Samples = 20 },
        new("verify.error", 0.021, "degC", -0.25, 0.25, Verdict.Pass)
        {
            Step = "verify", Setpoint = "check", ExpandedUncertainty = 0.05, CoverageFactor = 2, DecisionRule = "guarded",
            AcceptanceLow = -0.2, AcceptanceHigh = 0.2, Note = "after trim",
        },
        new("verify.resistance", 1.1e5, "ohm", null, 2e5, Verdict.Pass) { Step = "verify" },
    ];
}
