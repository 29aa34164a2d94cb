using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Extensions.Logging;
using Npgsql;
using Polly;
using Polly.Retry;

namespace LineTest.Factory.Forwarding;

/// <summary>
/// Keeps one station's results forwarded: a pass whenever <see cref="FactoryForwardingOptions.PollInterval"/> has
/// passed, each pass retried through a Polly retry pipeline (exponential backoff with jitter, up to
/// <see cref="FactoryForwardingOptions.MaxRetryDelay"/>, without limit on attempts) while the server is down,
/// unreachable or refusing. The station goes on testing and storing meanwhile: the loop only reads its database.
/// The backlog (count, oldest) is kept current for the screen and logged when it changes state.
/// </summary>
public sealed partial class StationForwardingLoop : IFactoryBacklog, IAsyncDisposable
{
    private readonly string _resultsDirectory;
    private readonly FactoryForwarder _forwarder;
    private readonly FactoryForwardingOptions _options;
    private readonly TimeProvider _time;
    private readonly ILogger<StationForwardingLoop> _logger;
    private readonly ResiliencePipeline _pipeline;

    // Written by the loop, read by the screen: replaced whole, never mutated.
    private volatile FactoryBacklogStatus _status = FactoryBacklogStatus.Unknown;
    private SqliteOutbox? _outbox;
    private string? _factoryId;
    private DateTimeOffset? _lastForwarded;

    /// <summary>Creates the loop for the results folder <paramref name="resultsDirectory"/>.</summary>
    public StationForwardingLoop(
        string resultsDirectory, FactoryForwarder forwarder, FactoryForwardingOptions options, TimeProvider time, ILogger<StationForwardingLoop> logger)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsDirectory);
        ArgumentNullException.ThrowIfNull(forwarder);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(logger);
        _resultsDirectory = resultsDirectory;
        _forwarder = forwarder;
        _options = options;
        _time = time;
        _logger = logger;
        _pipeline = new ResiliencePipelineBuilder { TimeProvider = time }
            .AddRetry(new RetryStrategyOptions
            {
                // Every server-side failure is worth retrying: down, unreachable, slow, disk full, authentication
                // refused (a password fixed by an administrator must not need a station restart).
                ShouldHandle = new PredicateBuilder().Handle<NpgsqlException>().Handle<TimeoutException>().Handle<FactoryConflictException>(),
                MaxRetryAttempts = int.MaxValue,
                BackoffType = DelayBackoffType.Exponential,
                UseJitter = true,
                Delay = options.RetryDelay,
                MaxDelay = options.MaxRetryDelay,
                OnRetry = async args =>
                {
                    var problem = args.Outcome.Exception?.Message ?? "unknown failure";
                    await RefreshAsync(problem, args.AttemptNumber + 1, args.Context.CancellationToken).ConfigureAwait(false);
                    LogRetrying(args.AttemptNumber + 1, args.RetryDelay.TotalSeconds, _status.Count, Oldest(_status), problem);
                },
            })
            .Build();
    }

    /// <inheritdoc />
    public FactoryBacklogStatus Current => _status;

    /// <summary>Forwards until <paramref name="ct"/> is cancelled.</summary>
    public async Task RunAsync(CancellationToken ct)
    {
        while (!ct.IsCancellationRequested)
        {
            try
            {
                await DrainAsync(ct).ConfigureAwait(false);
                await Task.Delay(_options.PollInterval, _time, ct).ConfigureAwait(false);
            }
            catch (OperationCanceledException) when (ct.IsCancellationRequested)
            {
                return;
            }
            catch (Exception ex) when (ex is ResultStoreException or Schema.FactorySchemaException or InvalidOperationException)
            {
                // Not a server outage: the station's own database or the factory's schema cannot be used. Said
                // loudly and tried again later; the station goes on testing.
                _status = _status with { Problem = ex.Message, FailedAttempts = _status.FailedAttempts + 1 };
                LogCannotForward(ex.Message);
                try
                {
                    await Task.Delay(_options.MaxRetryDelay, _time, ct).ConfigureAwait(false);
                }
                catch (OperationCanceledException)
                {
                    return;
                }
            }
        }
    }

    /// <summary>One pass: forwards everything waiting now, retrying through outages, and returns what it did.</summary>
    public async Task<ForwardResult> DrainAsync(CancellationToken ct)
    {
        if (_outbox is null && !File.Exists(ResultsDatabase.PathIn(_resultsDirectory)))
        {
            // Nothing stored yet: nothing to forward, and the database is the station store's to create.
            _status = FactoryBacklogStatus.Unknown;
            return ForwardResult.None;
        }

        var wasFailing = _status.Problem is not null;
        var result = await _pipeline.ExecuteAsync(
            async token =>
            {
                _outbox ??= SqliteOutbox.Open(_resultsDirectory);
                var forwarded = await _forwarder.ForwardAsync(_outbox, token).ConfigureAwait(false);
                _factoryId = await _forwarder.EnsureReadyAsync(token).ConfigureAwait(false);
                return forwarded;
            },
            ct).ConfigureAwait(false);
        if (result.Stored + result.Duplicates + result.Refused > 0)
        {
            _lastForwarded = _time.GetUtcNow();
        }

        await RefreshAsync(null, 0, ct).ConfigureAwait(false);
        if (wasFailing)
        {
            LogResumed(result.Stored, _status.Count);
        }

        return result;
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        if (_outbox is { } outbox)
        {
            await outbox.DisposeAsync().ConfigureAwait(false);
        }
    }

    private async Task RefreshAsync(string? problem, int failedAttempts, CancellationToken ct)
    {
        try
        {
            _outbox ??= SqliteOutbox.Open(_resultsDirectory);
            // Before the first contact the factory is the one last forwarded to (or none: everything waits).
            var factory = _factoryId ?? await _outbox.ReadLastFactoryIdAsync(ct).ConfigureAwait(false) ?? "(none yet)";
            var backlog = await _outbox.ReadBacklogAsync(factory, ct).ConfigureAwait(false);
            _status = new FactoryBacklogStatus(backlog.Count, backlog.OldestEndedUtc, _lastForwarded, problem, failedAttempts);
        }
        catch (ResultStoreException ex)
        {
            _status = _status with { Problem = problem ?? ex.Message, FailedAttempts = failedAttempts };
        }
    }

    private static string Oldest(FactoryBacklogStatus status) =>
        status.OldestEndedUtc is { } oldest ? oldest.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss", System.Globalization.CultureInfo.InvariantCulture) + " UTC" : "none";

    [LoggerMessage(EventId = 3010, Level = LogLevel.Warning, Message = "Factory database unavailable (attempt {Attempt}, next in {DelaySeconds:F1} s): {Backlog} run(s) waiting, the oldest ended {OldestEnded}; testing goes on. {Problem}")]
    private partial void LogRetrying(int attempt, double delaySeconds, long backlog, string oldestEnded, string problem);

    [LoggerMessage(EventId = 3011, Level = LogLevel.Information, Message = "Factory database reachable again: {Stored} run(s) forwarded, {Backlog} waiting")]
    private partial void LogResumed(int stored, long backlog);

    [LoggerMessage(EventId = 3012, Level = LogLevel.Error, Message = "Runs cannot be forwarded to the factory database: {Problem}")]
    private partial void LogCannotForward(string problem);
}
