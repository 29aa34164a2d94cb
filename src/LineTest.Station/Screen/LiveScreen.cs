using Spectre.Console;

namespace LineTest.Station.Screen;

/// <summary>
/// The screen loop: redraws the model five times a second in place until stopped, then draws the last state once more.
/// While it runs it owns the terminal (log events go to the log file only; see <c>Composition/LogRouting</c>).
/// </summary>
public static class LiveScreen
{
    /// <summary>Draws <paramref name="model"/> (and what is being typed, from <paramref name="typed"/>) until <paramref name="ct"/> is cancelled.</summary>
    public static async Task RunAsync(StationScreenModel model, Func<string> typed, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(typed);
        await AnsiConsole.Live(ScreenRenderer.Build(model.Snapshot()))
            .AutoClear(false)
            .Overflow(VerticalOverflow.Ellipsis)
            .Cropping(VerticalOverflowCropping.Bottom)
            .StartAsync(async ctx =>
            {
                while (!ct.IsCancellationRequested)
                {
                    ctx.UpdateTarget(ScreenRenderer.Build(model.Snapshot(), typed()));
                    try
                    {
                        await Task.Delay(200, ct).ConfigureAwait(false);
                    }
                    catch (OperationCanceledException)
                    {
                        break;
                    }
                }

                ctx.UpdateTarget(ScreenRenderer.Build(model.Snapshot()));
            }).ConfigureAwait(false);
    }
}
