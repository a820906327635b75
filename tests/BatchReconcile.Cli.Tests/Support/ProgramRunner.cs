using System.Diagnostics;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>The outcome of one run of the real program.</summary>
public sealed record ProgramResult(int ExitCode, string Stdout, string Stderr);

/// <summary>Starts the built <c>batchreconcile</c> as a real process and waits for it.</summary>
public static class ProgramRunner
{
    // The demo ingests a week of exports and writes a digest; on a busy two-core machine that can take a while.
    private static readonly TimeSpan Timeout = TimeSpan.FromSeconds(180);

    public static Task<ProgramResult> RunAsync(params string[] args) => RunWithAsync(null, args);

    /// <summary>Runs the program with variables added to its environment (e.g. <c>Storage__Provider</c>).</summary>
    public static async Task<ProgramResult> RunWithAsync(IReadOnlyDictionary<string, string>? environment, params string[] args)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = RepoPaths.Root,
            StandardOutputEncoding = System.Text.Encoding.UTF8,
            StandardErrorEncoding = System.Text.Encoding.UTF8,
        };
        foreach (var (name, value) in environment ?? new Dictionary<string, string>())
        {
            start.Environment[name] = value;
        }

        start.ArgumentList.Add(RepoPaths.ProgramDll);
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        using var process = Process.Start(start) ?? throw new InvalidOperationException("dotnet did not start");
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        using var cts = new CancellationTokenSource(Timeout);
        try
        {
            await process.WaitForExitAsync(cts.Token);
        }
        catch (OperationCanceledException)
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"batchreconcile {string.Join(' ', args)} did not finish in {Timeout}");
        }

        return new ProgramResult(process.ExitCode, await stdout, await stderr);
    }

    /// <summary>Runs the program and fails with its output when it does not exit with <paramref name="expectedExit"/>.</summary>
    public static async Task<ProgramResult> RunExpectingAsync(int expectedExit, params string[] args)
    {
        var result = await RunAsync(args);
        if (result.ExitCode != expectedExit)
        {
            throw new InvalidOperationException(
                $"batchreconcile {string.Join(' ', args)} exited {result.ExitCode}, expected {expectedExit}\nstdout:\n{result.Stdout}\nstderr:\n{result.Stderr}");
        }

        return result;
    }
}
