using System.Diagnostics;
using System.Text;

namespace LineTest.Station.Tests.Cli;

/// <summary>A real <c>linetest</c> process (the built executable) with its output captured, for tests between processes.</summary>
internal sealed class LinetestProcess : IDisposable
{
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(180);

    private readonly Process _process;
    private readonly StringBuilder _output = new();
    private readonly StringBuilder _error = new();
    private readonly Lock _gate = new();

    private LinetestProcess(Process process)
    {
        _process = process;
    }

    public int Id => _process.Id;

    public string Output
    {
        get
        {
            lock (_gate)
            {
                return _output.ToString();
            }
        }
    }

    public string Error
    {
        get
        {
            lock (_gate)
            {
                return _error.ToString();
            }
        }
    }

    /// <summary>Starts <c>linetest ARGS</c> in a working folder of its own; <paramref name="environment"/> sets settings.</summary>
    public static LinetestProcess Start(IReadOnlyDictionary<string, string>? environment, params string[] args)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = LineTest.TestSupport.Some.TempDirectory(),
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "linetest.dll"));
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        foreach (var (key, value) in environment ?? new Dictionary<string, string>())
        {
            start.Environment[key] = value;
        }

        var process = new Process { StartInfo = start };
        var started = new LinetestProcess(process);
        process.OutputDataReceived += (_, e) => started.Append(started._output, e.Data);
        process.ErrorDataReceived += (_, e) => started.Append(started._error, e.Data);
        process.Start();
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
        return started;
    }

    /// <summary>Waits until the output holds <paramref name="text"/> at least <paramref name="times"/> times.</summary>
    public async Task WaitForAsync(string text, int times = 1)
    {
        var waited = Stopwatch.StartNew();
        while (waited.Elapsed < Patience && !_process.HasExited)
        {
            if (Count(Output, text) >= times)
            {
                return;
            }

            await Task.Delay(50);
        }

        if (Count(Output, text) < times)
        {
            throw new TimeoutException($"'{text}' (x{times}) did not appear. Output:\n{Output}\nError:\n{Error}");
        }
    }

    public async Task<int> WaitForExitAsync()
    {
        using var cancel = new CancellationTokenSource(Patience);
        await _process.WaitForExitAsync(cancel.Token);
        return _process.ExitCode;
    }

    public void Kill() => _process.Kill(entireProcessTree: true);

    public void Dispose()
    {
        if (!_process.HasExited)
        {
            _process.Kill(entireProcessTree: true);
        }

        _process.Dispose();
    }

    private static int Count(string text, string word)
    {
        var count = 0;
        for (var i = text.IndexOf(word, StringComparison.Ordinal); i >= 0; i = text.IndexOf(word, i + word.Length, StringComparison.Ordinal))
        {
            count++;
        }

        return count;
    }

    private void Append(StringBuilder to, string? line)
    {
        if (line is null)
        {
            return;
        }

        lock (_gate)
        {
            to.AppendLine(line);
        }
    }
}
