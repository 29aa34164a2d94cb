using LineTest.Factory.Forwarding;

namespace LineTest.Station.Screen;

/// <summary>Everything the operator screen shows at one moment.</summary>
/// <remarks>
/// <see cref="Notice"/> is the last answer, refusal or scanner message, shown above the prompt so it does not hide it;
/// <see cref="Info"/> are lines shown below the table until the next input (a unit's history); <see cref="Factory"/> is
/// the forwarding backlog ("factory: 12 run(s) waiting since …"), null when the station forwards to no factory database.
/// </remarks>
public sealed record ScreenSnapshot(
    ScreenHeader Header,
    IReadOnlyList<SlotView> Slots,
    double? SetpointC,
    double? ReferenceC,
    string SourcePhase,
    string Prompt,
    string? Caution,
    string? Alarm,
    string? Notice = null,
    IReadOnlyList<string>? Info = null,
    FactoryBacklogStatus? Factory = null);
