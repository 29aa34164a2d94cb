namespace LineTest.Runtime.Batches;

/// <summary>An operator stand-in for unattended simulated shifts: every prompt is confirmed at once.</summary>
public sealed class AutoConfirmOperator : IOperatorChannel
{
    /// <summary>The prompts shown, in order.</summary>
    public List<string> Prompts { get; } = [];

    /// <inheritdoc />
    public Task PromptAsync(string text, bool confirm, CancellationToken cancellationToken)
    {
        lock (Prompts)
        {
            Prompts.Add(text);
        }

        return Task.CompletedTask;
    }
}
