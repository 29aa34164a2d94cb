using System.Diagnostics;
using System.Text;

namespace LineTest.Station.Tests.Hosting;

/// <summary>
/// <c>linetest run</c> as a child process with its standard input, output and error redirected, as a station started
/// by a service manager would run: plain lines out, typed lines in.
/// </summary>
internal sealed class StationProcess : IDisposable
{
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(120);

    private readonly Process _process;
    private readonly StringBuilder _output = new();
    private readonly StringBuilder _error = new();
    private readonly Lock _gate = new();

    public StationProcess(string workingDirectory, IReadOnlyDictionary<string, string> settings)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "linetest.dll"));
        start.ArgumentList.Add("run");
        foreach (var (key, value) in settings)
        {
            start.Environment["LINETEST_" + key.Replace(":", "__", StringComparison.Ordinal)] = value;
        }

        _process = new Process { StartInfo = start };
        _process.OutputDataReceived += (_, e) => Append(_output, e.Data);
        _process.ErrorDataReceived += (_, e) => Append(_error, e.Data);
        _process.Start();
        _process.BeginOutputReadLine();
        _process.BeginErrorReadLine();
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

    /// <summary>Types a line on the station's keyboard.</summary>
    public void Type(string line)
    {
        _process.StandardInput.WriteLine(line);
        _process.StandardInput.Flush();
    }

    /// <summary>Closes the keyboard (end of input stops an idle station).</summary>
    public void CloseInput() => _process.StandardInput.Close();

    /// <summary>True while the process has <paramref name="path"/> open (Linux: its file descriptors in /proc).</summary>
    public bool HasOpen(string path)
    {
        try
        {
            return Directory.EnumerateFileSystemEntries($"/proc/{_process.Id}/fd").Any(fd => Target(fd) == path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return false;
        }
    }

    /// <summary>Waits until the output holds <paramref name="text"/> <paramref name="times"/> times; the output so far.</summary>
    public async Task<string> WaitForAsync(string text, int times = 1)
    {
        var waited = Stopwatch.StartNew();
        while (waited.Elapsed < Patience)
        {
            var output = Output;
            if (Count(output, text) >= times)
            {
                return output;
            }

            if (_process.HasExited)
            {
                break;
            }

            await Task.Delay(50);
        }

        throw new TimeoutException($"'{text}' (x{times}) did not appear. Output:\n{Output}\nError:\n{Error}");
    }

    public async Task<int> WaitForExitAsync()
    {
        using var cancel = new CancellationTokenSource(Patience);
        await _process.WaitForExitAsync(cancel.Token);
        return _process.ExitCode;
    }

    public static int Count(string text, string word)
    {
        var count = 0;
        for (var i = text.IndexOf(word, StringComparison.Ordinal); i >= 0; i = text.IndexOf(word, i + word.Length, StringComparison.Ordinal))
        {
            count++;
        }

        return count;
    }

    public void Dispose()
    {
        if (!_process.HasExited)
        {
            _process.Kill(entireProcessTree: true);
            _process.WaitForExit(10_000);
        }

        _process.Dispose();
    }

    private static string? Target(string fd)
    {
        try
        {
            return File.ResolveLinkTarget(fd, returnFinalTarget: false)?.FullName;
        }
        catch (IOException)
        {
            return null;
        }
    }

    private void Append(StringBuilder buffer, string? line)
    {
        if (line is null)
        {
            return;
        }

        lock (_gate)
        {
            buffer.AppendLine(line);
        }
    }
}
