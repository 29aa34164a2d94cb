namespace LineTest.Station.Hosting;

/// <summary>
/// A sequence prompt that waits for the operator (Enter): the coordinator waits on <see cref="WaitAsync"/>, the
/// dialogue loop hands it the next typed line (<see cref="TryAnswer"/>). Thread-safe.
/// </summary>
public sealed class PromptAnswers
{
    private readonly Lock _gate = new();
    private TaskCompletionSource<string?>? _pending;

    /// <summary>True while a prompt waits for an answer.</summary>
    public bool IsWaiting
    {
        get
        {
            lock (_gate)
            {
                return _pending is not null;
            }
        }
    }

    /// <summary>Waits for the next answer.</summary>
    public async Task<string?> WaitAsync(CancellationToken ct)
    {
        var tcs = new TaskCompletionSource<string?>(TaskCreationOptions.RunContinuationsAsynchronously);
        lock (_gate)
        {
            _pending = tcs;
        }

        using var registration = ct.Register(() =>
        {
            lock (_gate)
            {
                if (ReferenceEquals(_pending, tcs))
                {
                    _pending = null;
                }
            }

            tcs.TrySetCanceled(ct);
        });
        return await tcs.Task.ConfigureAwait(false);
    }

    /// <summary>Answers the waiting prompt with <paramref name="line"/>; false when none waits.</summary>
    public bool TryAnswer(string line)
    {
        lock (_gate)
        {
            if (_pending is not { } pending)
            {
                return false;
            }

            _pending = null;
            return pending.TrySetResult(line);
        }
    }
}
