using LineTest.Station.Screen;

namespace LineTest.Station.Hosting;

/// <summary>
/// What the station says to the operator: on the live screen (prompt, notice above it, lines below the table) and,
/// when output is not a terminal, as plain lines.
/// </summary>
public sealed class StationTalk
{
    private readonly TextWriter? _plain;

    /// <summary>Talks through <paramref name="model"/>, and also to <paramref name="plain"/> when not null.</summary>
    public StationTalk(StationScreenModel model, TextWriter? plain)
    {
        ArgumentNullException.ThrowIfNull(model);
        Model = model;
        _plain = plain;
    }

    /// <summary>The screen.</summary>
    public StationScreenModel Model { get; }

    /// <summary>True when plain lines are written (output is not a terminal).</summary>
    public bool IsPlain => _plain is not null;

    /// <summary>The instruction: what the operator should do now.</summary>
    public void Say(string text)
    {
        Model.Prompt(text);
        _plain?.WriteLine(text);
    }

    /// <summary>An answer, refusal or news: above the prompt, so the instruction stays in view.</summary>
    public void Tell(string text)
    {
        Model.Notice(text);
        _plain?.WriteLine(text);
    }

    /// <summary>A few lines shown below the table until the next input (a unit's history).</summary>
    public void Show(IReadOnlyList<string> lines)
    {
        Model.Info(lines);
        foreach (var line in lines)
        {
            _plain?.WriteLine(line);
        }
    }

    /// <summary>A plain line only (the screen shows the same fact its own way).</summary>
    public void Log(string text) => _plain?.WriteLine(text);
}
