using LineTest.Runtime.Batches;

namespace LineTest.Station.Hosting;

/// <summary>Prompts on the console; a confirmation waits for Enter.</summary>
public sealed class ConsoleOperator : IOperatorChannel
{
    private readonly TextReader _input;
    private readonly TextWriter _output;

    /// <summary>Creates the channel.</summary>
    public ConsoleOperator(TextReader input, TextWriter output)
    {
        _input = input;
        _output = output;
    }

    /// <inheritdoc />
    public async Task PromptAsync(string text, bool confirm, CancellationToken cancellationToken)
    {
        _output.WriteLine(confirm ? $"{text} — then press Enter." : text);
        if (confirm)
        {
            await _input.ReadLineAsync(cancellationToken).ConfigureAwait(false);
        }
    }
}
