namespace LineTest.Web.Tests.Support;

/// <summary>
/// The wall clock moved by a fixed offset: "now" lies elsewhere in time while timers and timestamps stay real, so a
/// page's live refresh keeps running while its shifts are laid out around a simulated shift's runs.
/// </summary>
public sealed class ShiftedClock(TimeSpan offset) : TimeProvider
{
    /// <inheritdoc />
    public override DateTimeOffset GetUtcNow() => System.GetUtcNow() + offset;
}
