namespace LineTest.Runtime.Batches;

/// <summary>How the coordinator talks to the operator.</summary>
public interface IOperatorChannel
{
    /// <summary>Shows a prompt; when <paramref name="confirm"/> is true, completes once the operator confirms.</summary>
    Task PromptAsync(string text, bool confirm, CancellationToken cancellationToken);
}
