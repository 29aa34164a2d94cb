using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Station.Demo;

/// <summary>
/// How long a simulated shift is planned to take, so that it can be laid out to end before now without simulating it
/// twice. One batch of defect-free units on the simulator (the <c>dry-run</c> batch, nothing stored) gives the batch
/// time; every batch of the shift is planned at that time times <see cref="Margin"/>, with the operator's reload gap
/// between batches; and one batch's worst overrun (every settle and soak of the sequence's setpoints running to its
/// timeout) is kept free before now. The shift checks <see cref="MayStartBatch"/> before each batch, so even a shift
/// slower than its plan never stores a run in the future: it stops instead, and says so.
/// </summary>
public sealed record ShiftPlan
{
    /// <summary>
    /// Planned batch time over the dry-run batch. The dry-run batch starts from standby, as a shift's first batch does,
    /// so it is already longer than a typical batch of a shift (1,729 s against a mean of 1,666 s and a largest of
    /// 2,007 s over the 75 batches of <c>demo --units 300 --seed 3</c>, ctp40a-dac); 1.25 covers the largest with room.
    /// </summary>
    public const double Margin = 1.25;

    /// <summary>An empty folder's first shift leaves room for this many shifts of its size before now.</summary>
    public const int ShiftsInEmptyFolder = 3;

    /// <summary>An empty folder's first shift starts at 06:00 UTC at least this far back.</summary>
    public static readonly TimeSpan HistoryWindow = TimeSpan.FromDays(7);

    /// <summary>Batches in the shift.</summary>
    public required int Batches { get; init; }

    /// <summary>Seconds of the dry-run batch (at least its thermal bound).</summary>
    public required double DryBatchSeconds { get; init; }

    /// <summary>Virtual seconds between batches (unload and load).</summary>
    public required double ReloadSeconds { get; init; }

    /// <summary>Seconds one batch can take beyond its plan when every settle and soak runs to its timeout.</summary>
    public required double WorstOverrunSeconds { get; init; }

    /// <summary>Planned seconds per batch.</summary>
    public double BatchSeconds => DryBatchSeconds * Margin;

    /// <summary>The planned length of the shift.</summary>
    public TimeSpan Length => TimeSpan.FromSeconds((Batches * BatchSeconds) + (Math.Max(0, Batches - 1) * ReloadSeconds));

    /// <summary>The time the shift needs before now: its planned length and one batch's worst overrun.</summary>
    public TimeSpan Needed => Length + TimeSpan.FromSeconds(WorstOverrunSeconds);

    /// <summary>Plans a shift of <paramref name="units"/> units, <paramref name="slots"/> per batch, from one dry-run batch.</summary>
    public static async Task<ShiftPlan> EstimateAsync(
        FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int units, int slots, int seed, double reloadSeconds, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(slots);
        var perBatch = Math.Max(1, Math.Min(units, slots));
        var dry = await DryRun.RunAsync(fixture, sequence, sha256, perBatch, seed, ct).ConfigureAwait(false);
        var overrun = sequence.Setpoints.Count * (sequence.Stability.TimeoutSeconds + sequence.Soak.TimeoutSeconds);
        return new ShiftPlan
        {
            Batches = (units + perBatch - 1) / perBatch,
            DryBatchSeconds = Math.Max(dry.BatchSeconds, dry.Bound.BatchSeconds),
            ReloadSeconds = reloadSeconds,
            WorstOverrunSeconds = overrun,
        };
    }

    /// <summary>
    /// Where the shift starts: one reload gap after the last stored run; in an empty folder at 06:00 UTC a week back,
    /// or further back when <see cref="ShiftsInEmptyFolder"/> shifts of this size (with their reload gaps) need more.
    /// </summary>
    public DateTimeOffset Start(DateTimeOffset? lastEnded, DateTimeOffset now)
    {
        if (lastEnded is { } last)
        {
            return last + TimeSpan.FromSeconds(ReloadSeconds);
        }

        var room = (Needed + TimeSpan.FromSeconds(ReloadSeconds)) * ShiftsInEmptyFolder;
        if (room <= HistoryWindow)
        {
            return new DateTimeOffset((now - HistoryWindow).UtcDateTime.Date.AddHours(6), TimeSpan.Zero);
        }

        var start = new DateTimeOffset((now - room).UtcDateTime.Date.AddHours(6), TimeSpan.Zero);
        return start > now - room ? start.AddDays(-1) : start;
    }

    /// <summary>True when the shift, started at <paramref name="start"/>, is planned to end with a batch's overrun to spare before <paramref name="now"/>.</summary>
    public bool Fits(DateTimeOffset start, DateTimeOffset now) => start + Needed <= now;

    /// <summary>True when a batch started at <paramref name="at"/> ends before <paramref name="now"/> even at its worst.</summary>
    public bool MayStartBatch(DateTimeOffset at, DateTimeOffset now) => at + TimeSpan.FromSeconds(BatchSeconds + WorstOverrunSeconds) <= now;

    /// <summary>How many units (whole batches of <paramref name="slots"/>) fit between <paramref name="start"/> and <paramref name="now"/>.</summary>
    public int UnitsThatFit(DateTimeOffset start, DateTimeOffset now, int slots)
    {
        var seconds = (now - start).TotalSeconds - WorstOverrunSeconds + ReloadSeconds;
        return seconds <= 0 ? 0 : (int)Math.Floor(seconds / (BatchSeconds + ReloadSeconds)) * Math.Max(1, slots);
    }
}
