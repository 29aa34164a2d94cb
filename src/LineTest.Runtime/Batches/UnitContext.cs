using LineTest.Core.Results;
using LineTest.Core.Units;

namespace LineTest.Runtime.Batches;

/// <summary>Everything the coordinator knows about one unit during its run. Touched only by the coordinator's loop.</summary>
internal sealed class UnitContext
{
    public UnitContext(SlotLoad load, DateTimeOffset started)
    {
        Load = load;
        Started = started;
        RunId = Guid.CreateVersion7(started);
    }

    /// <summary>The run's id, fixed at load so the journal entry and the stored run share it.</summary>
    public Guid RunId { get; }

    public SlotLoad Load { get; }

    public int Slot => Load.Slot;

    public string Serial => Load.Serial;

    public UnitStateMachine Machine { get; } = new();

    public DateTimeOffset Started { get; }

    public List<Reading> Readings { get; } = [];

    public List<SetpointRecord> Setpoints { get; } = [];

    /// <summary>Calibration points by setpoint name: mean reference °C and mean unit output.</summary>
    public Dictionary<string, (double ReferenceC, double Output)> CalibrationPoints { get; } = new(StringComparer.Ordinal);

    /// <summary>Trim register values currently in the unit (nominal until written).</summary>
    public Dictionary<string, long> Registers { get; } = new(StringComparer.Ordinal);

    /// <summary>The unit's fitted I–V sweeps so far, in order.</summary>
    public List<IvSweepRecord> Sweeps { get; } = [];

    public TrimRecord? Trim { get; set; }

    public string? Firmware { get; set; }

    public string? FirstFailingReading { get; set; }

    public string? FirstFailureReason { get; set; }

    public string CurrentStep { get; set; } = "loaded";

    public int StepIndex { get; set; }

    public RunRecord? Record { get; set; }

    public bool IsFinished => Machine.IsFinished;

    /// <summary>Adds a reading; remembers the first failing one.</summary>
    public void Add(Reading reading)
    {
        Readings.Add(reading);
        if (reading.Verdict != Verdict.Pass && FirstFailingReading is null)
        {
            FirstFailingReading = reading.Name;
            FirstFailureReason = reading.Note is { } note ? (note.StartsWith(reading.Name, StringComparison.Ordinal) ? note : $"{reading.Name}: {note}") : ReadingText.Describe(reading);
        }
    }
}
