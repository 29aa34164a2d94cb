namespace LineTest.Station.Screen;

/// <summary>Everything the operator screen shows at one moment.</summary>
/// <remarks><see cref="Notice"/> is the last refusal or scanner message, shown above the prompt so it does not hide it.</remarks>
public sealed record ScreenSnapshot(
    ScreenHeader Header,
    IReadOnlyList<SlotView> Slots,
    double? SetpointC,
    double? ReferenceC,
    string SourcePhase,
    string Prompt,
    string? Caution,
    string? Alarm,
    string? Notice = null);
