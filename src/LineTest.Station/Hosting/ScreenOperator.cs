using LineTest.Runtime.Batches;
using LineTest.Station.Screen;

namespace LineTest.Station.Hosting;

/// <summary>Shows sequence prompts on the operator screen; a confirmation waits for Enter.</summary>
public sealed class ScreenOperator : IOperatorChannel
{
    private readonly StationScreenModel _model;
    private readonly Func<CancellationToken, Task<string?>> _readLine;
    private readonly TextWriter? _plain;

    /// <summary>Creates the channel.</summary>
    public ScreenOperator(StationScreenModel model, Func<CancellationToken, Task<string?>> readLine, TextWriter? plain)
    {
        _model = model;
        _readLine = readLine;
        _plain = plain;
    }

    /// <inheritdoc />
    public async Task PromptAsync(string text, bool confirm, CancellationToken cancellationToken)
    {
        var shown = confirm ? $"{text} Then press Enter." : text;
        _model.Prompt(shown);
        _plain?.WriteLine("> " + shown);
        if (confirm)
        {
            await _readLine(cancellationToken).ConfigureAwait(false);
        }
    }
}
