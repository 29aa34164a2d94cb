using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Scanner;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Hosting;

/// <summary>
/// Carries the serial scanner's codes into the operator's input, in the order they are scanned, on a task of its own.
/// The scanner is a diagnostic-grade peripheral: whatever goes wrong with it (port missing, lost, a fault) is told to the
/// operator once, who can type serials meanwhile, and the port is tried again every <see cref="RetryDelay"/>; it never
/// stops the station.
/// </summary>
public sealed partial class ScannerFeed : IAsyncDisposable
{
    /// <summary>Wait between attempts to reopen a scanner port that failed.</summary>
    public static readonly TimeSpan RetryDelay = TimeSpan.FromSeconds(2);

    private readonly CancellationTokenSource _stop = new();
    private readonly Task _loop;

    private ScannerFeed(IBarcodeScanner scanner, string port, OperatorInput input, TimeProvider wallClock, ILogger logger)
    {
        _loop = Task.Run(() => RunAsync(scanner, port, input, wallClock, logger, _stop.Token));
    }

    /// <summary>Starts feeding <paramref name="scanner"/>'s codes into <paramref name="input"/>.</summary>
    /// <param name="scanner">The scanner.</param>
    /// <param name="port">Its port, for messages.</param>
    /// <param name="input">Where the codes go.</param>
    /// <param name="wallClock">Clock for the retry delay (the wall clock: the scanner is real even under the simulator).</param>
    /// <param name="logger">Logger.</param>
    public static ScannerFeed Start(IBarcodeScanner scanner, string port, OperatorInput input, TimeProvider wallClock, ILogger logger)
    {
        ArgumentNullException.ThrowIfNull(scanner);
        ArgumentNullException.ThrowIfNull(port);
        ArgumentNullException.ThrowIfNull(input);
        ArgumentNullException.ThrowIfNull(wallClock);
        ArgumentNullException.ThrowIfNull(logger);
        return new ScannerFeed(scanner, port, input, wallClock, logger);
    }

    /// <summary>Stops listening.</summary>
    public async ValueTask DisposeAsync()
    {
        await _stop.CancelAsync().ConfigureAwait(false);
        try
        {
            await _loop.ConfigureAwait(false);
        }
        catch (OperationCanceledException)
        {
            // Stopped while waiting for a code.
        }

        _stop.Dispose();
    }

    private static async Task RunAsync(IBarcodeScanner scanner, string port, OperatorInput input, TimeProvider wallClock, ILogger logger, CancellationToken ct)
    {
        var troubled = false;
        while (!ct.IsCancellationRequested)
        {
            string problem;
            try
            {
                var scan = await scanner.NextAsync(ct).ConfigureAwait(false);
                if (scan.EndOfInput)
                {
                    return;
                }

                if (troubled)
                {
                    troubled = false;
                    LogScannerBack(logger, port);
                    input.Post(OperatorEntry.Notice($"The scanner on {port} works again."));
                }

                if (!input.Post(OperatorEntry.Scanned(scan)))
                {
                    return;
                }

                continue;
            }
            catch (OperationCanceledException) when (ct.IsCancellationRequested)
            {
                return;
            }
            catch (InstrumentFaultException ex)
            {
                problem = ex.Message;
            }
#pragma warning disable CA1031 // Any failure of the scanner must leave the station running: it is told and retried.
            catch (Exception ex)
#pragma warning restore CA1031
            {
                LogScannerFailed(logger, port, ex);
                problem = $"scanner on {port}: {ex.Message}";
            }

            if (!troubled)
            {
                troubled = true;
                LogScannerTrouble(logger, port, problem);
                input.Post(OperatorEntry.Notice($"Scanner problem: {problem}. Type serials on the keyboard meanwhile; the scanner is tried again every {RetryDelay.TotalSeconds:0} s."));
            }

            try
            {
                await Task.Delay(RetryDelay, wallClock, ct).ConfigureAwait(false);
            }
            catch (OperationCanceledException)
            {
                return;
            }
        }
    }

    [LoggerMessage(EventId = 2020, Level = LogLevel.Warning, Message = "Scanner on {Port} cannot be used: {Problem}; scans are taken from the keyboard until it works again")]
    private static partial void LogScannerTrouble(ILogger logger, string port, string problem);

    [LoggerMessage(EventId = 2021, Level = LogLevel.Information, Message = "Scanner on {Port} works again")]
    private static partial void LogScannerBack(ILogger logger, string port);

    [LoggerMessage(EventId = 2022, Level = LogLevel.Error, Message = "Scanner on {Port} failed unexpectedly")]
    private static partial void LogScannerFailed(ILogger logger, string port, Exception exception);
}
