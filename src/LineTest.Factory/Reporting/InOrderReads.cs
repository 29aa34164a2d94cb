using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Reads parts (months) on several connections at once and hands them on in order: connection k reads parts k,
/// k + n, k + 2n, …, and each part is consumed as soon as it and every part before it are read, so only the parts in
/// flight are held. When a read or the consumer fails, the other readers stop before the failure is thrown (their
/// connections are closed by the caller after this returns).
/// </summary>
internal static class InOrderReads
{
    public static async Task RunAsync<TPart>(
        IReadOnlyList<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> connections,
        int parts,
        Func<(NpgsqlConnection Connection, NpgsqlTransaction Transaction), int, CancellationToken, Task<TPart>> read,
        Action<TPart> consume,
        CancellationToken ct)
    {
        var ready = new TaskCompletionSource<TPart>[parts];
        for (var p = 0; p < parts; p++)
        {
            ready[p] = new TaskCompletionSource<TPart>(TaskCreationOptions.RunContinuationsAsynchronously);
        }

        using var stop = CancellationTokenSource.CreateLinkedTokenSource(ct);
        var readers = connections.Select((c, k) => Task.Run(async () =>
        {
            for (var p = k; p < parts; p += connections.Count)
            {
                try
                {
                    ready[p].SetResult(await read(c, p, stop.Token).ConfigureAwait(false));
                }
                catch (Exception ex)
                {
                    ready[p].SetException(ex);
                    for (var later = p + connections.Count; later < parts; later += connections.Count)
                    {
                        ready[later].SetCanceled(stop.Token);
                    }

                    return;
                }
            }
        })).ToList();

        try
        {
            for (var p = 0; p < parts; p++)
            {
                consume(await ready[p].Task.ConfigureAwait(false));

                // Let the part go once consumed.
                ready[p] = null!;
            }
        }
        catch
        {
            await stop.CancelAsync().ConfigureAwait(false);
            await Task.WhenAll(readers.Select(r => r.ContinueWith(_ => { }, CancellationToken.None, TaskContinuationOptions.None, TaskScheduler.Default))).ConfigureAwait(false);
            throw;
        }

        await Task.WhenAll(readers).ConfigureAwait(false);
    }
}
