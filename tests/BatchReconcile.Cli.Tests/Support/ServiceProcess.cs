using System.Diagnostics;
using System.Globalization;
using System.Text;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>
/// The real <c>batchreconcile run</c> as a long-running process that the test controls: started on a
/// config and data folder, stopped with SIGTERM (as systemd does) or killed with SIGKILL (a crash).
/// Its stdout and stderr are read all the time, so the pipes never fill and block it.
/// </summary>
public sealed class ServiceProcess : IDisposable
{
    private static readonly TimeSpan StartTimeout = TimeSpan.FromSeconds(90);

    private readonly Process _process;
    private readonly StringBuilder _stdout = new();
    private readonly StringBuilder _stderr = new();
    private readonly object _gate = new();

    private ServiceProcess(Process process)
    {
        _process = process;
    }

    public int Id => _process.Id;

    public bool HasExited => _process.HasExited;

    public string Stdout
    {
        get
        {
            lock (_gate)
            {
                return _stdout.ToString();
            }
        }
    }

    public string Stderr
    {
        get
        {
            lock (_gate)
            {
                return _stderr.ToString();
            }
        }
    }

    /// <summary>
    /// Starts <c>run --config CONFIG --data DATA</c> and, unless told not to, waits until it logs that it
    /// is watching the inbox.
    /// </summary>
    /// <param name="waitUntilWatching">False to return at once (a test that must react to the first
    /// file the service takes cannot afford to be busy reading the log meanwhile).</param>
    /// <param name="environment">Variables added to the process's environment (e.g. <c>Storage__Provider</c>).</param>
    public static async Task<ServiceProcess> StartAsync(string configFolder, string dataFolder, bool waitUntilWatching = true, IReadOnlyDictionary<string, string>? environment = null)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = RepoPaths.Root,
            StandardOutputEncoding = Encoding.UTF8,
            StandardErrorEncoding = Encoding.UTF8,
        };
        foreach (var (name, value) in environment ?? new Dictionary<string, string>())
        {
            start.Environment[name] = value;
        }

        // `dotnet app.dll` runs the app inside this very process, so the pid is the one to signal.
        foreach (var arg in new[] { RepoPaths.ProgramDll, "run", "--config", configFolder, "--data", dataFolder })
        {
            start.ArgumentList.Add(arg);
        }

        var process = new Process { StartInfo = start, EnableRaisingEvents = true };
        var service = new ServiceProcess(process);
        process.OutputDataReceived += (_, e) => service.Append(service._stdout, e.Data);
        process.ErrorDataReceived += (_, e) => service.Append(service._stderr, e.Data);
        if (!process.Start())
        {
            throw new InvalidOperationException("dotnet did not start");
        }

        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
        if (!waitUntilWatching)
        {
            return service;
        }

        try
        {
            await Poll.UntilAsync(
                () => service.Stderr.Contains("Watching", StringComparison.Ordinal) || process.HasExited,
                StartTimeout,
                () => $"batchreconcile run did not report watching; stderr:\n{service.Stderr}");
        }
        catch
        {
            service.Dispose();
            throw;
        }

        if (process.HasExited)
        {
            await process.WaitForExitAsync();
            var message = $"batchreconcile run exited at start with {process.ExitCode}; stderr:\n{service.Stderr}";
            service.Dispose();
            throw new InvalidOperationException(message);
        }

        return service;
    }

    /// <summary>Sends SIGTERM (a clean stop) and waits for the exit; returns the exit code.</summary>
    public async Task<int> TerminateAsync(TimeSpan timeout)
    {
        using (var kill = Process.Start(new ProcessStartInfo("kill") { ArgumentList = { "-TERM", Id.ToString(CultureInfo.InvariantCulture) }, UseShellExecute = false })
            ?? throw new InvalidOperationException("kill did not start"))
        {
            await kill.WaitForExitAsync();
            if (kill.ExitCode != 0)
            {
                throw new InvalidOperationException($"kill -TERM {Id} exited with {kill.ExitCode}");
            }
        }

        return await WaitForExitAsync(timeout);
    }

    /// <summary>SIGKILL: the process dies at once, in whatever it was doing (a crash or power cut, as far as files go).</summary>
    public async Task KillHardAsync()
    {
        _process.Kill(entireProcessTree: false);
        await WaitForExitAsync(TimeSpan.FromSeconds(30));
    }

    public async Task<int> WaitForExitAsync(TimeSpan timeout)
    {
        using var cts = new CancellationTokenSource(timeout);
        try
        {
            await _process.WaitForExitAsync(cts.Token);
        }
        catch (OperationCanceledException)
        {
            throw new TimeoutException($"batchreconcile run (pid {Id}) did not exit within {timeout.TotalSeconds} s; stderr:\n{Stderr}");
        }

        // The parameterless wait also lets the asynchronous readers take in the last of the output.
        await _process.WaitForExitAsync();
        return _process.ExitCode;
    }

    public void Dispose()
    {
        try
        {
            if (!_process.HasExited)
            {
                _process.Kill(entireProcessTree: false);
                _process.WaitForExit(30_000);
            }
        }
        catch (InvalidOperationException)
        {
            // Never started or already gone.
        }

        _process.Dispose();
    }

    private void Append(StringBuilder target, string? line)
    {
        if (line is null)
        {
            return;
        }

        lock (_gate)
        {
            target.AppendLine(line);
        }
    }
}
