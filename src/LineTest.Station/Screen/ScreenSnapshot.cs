namespace LineTest.Station.Screen;

/// <summary>Everything the operator screen shows at one moment.</summary>
public sealed record ScreenSnapshot(
    ScreenHeader Header,
    IReadOnlyList<SlotView> Slots,
    double? SetpointC,
    double? ReferenceC,
    string SourcePhase,
    string Prompt,
    string? Caution,
    string? Alarm);
