using LineTest.Core.Results;
using LineTest.Runtime.Steps;

namespace LineTest.Runtime.Batches;

/// <summary>The state of one running batch.</summary>
internal sealed class BatchState
{
    public BatchState(BatchRequest request, DateTimeOffset started)
    {
        Request = request;
        Started = started;
        Id = request.BatchId ?? $"B{started:yyyyMMdd'T'HHmmss}-{Guid.NewGuid().ToString("N")[..6]}";
    }

    public BatchRequest Request { get; }

    public DateTimeOffset Started { get; }

    public string Id { get; }

    public List<UnitContext> Units { get; } = [];

    public List<SetpointRecord> SetpointHistory { get; } = [];

    /// <summary>The setpoint commanded ahead of its settle step, and when (see <see cref="BatchPlanner"/>); null once used.</summary>
    public (string Name, DateTimeOffset At)? PreCommanded { get; set; }

    /// <summary>
    /// Setpoints settled in predictive mode whose readings are taken from the predictions, by setpoint name (replaced at
    /// each settle; removed when a setpoint falls back to the window).
    /// </summary>
    public Dictionary<string, PredictiveApproach> Predictions { get; } = new(StringComparer.Ordinal);

    /// <summary>Units still in progress, in slot order (a fresh list each time: callers may end units while iterating).</summary>
    public IReadOnlyList<UnitContext> Active => Units.Where(u => !u.IsFinished).OrderBy(u => u.Slot).ToList();
}
