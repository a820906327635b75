using System.Diagnostics;
using System.Globalization;

namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>Starts programs as processes with stdout and stderr going to files, and reads their memory.</summary>
internal static class ProcessRun
{
    /// <summary>Runs to the end under GNU time; returns the wall time, exit code and peak resident set (MB).</summary>
    public static (double Seconds, int ExitCode, double PeakMb) Timed(string outFile, string errFile, params string[] command)
    {
        var memFile = errFile + ".maxrss";
        var stopwatch = Stopwatch.StartNew();
        using var process = Start(outFile, errFile, ["/usr/bin/time", "-f", "%M", "-o", memFile, .. command]);
        process.WaitForExit();
        var seconds = stopwatch.Elapsed.TotalSeconds;
        var kb = File.ReadAllLines(memFile).Select(l => l.Trim()).LastOrDefault(l => l.Length > 0 && char.IsDigit(l[0]));
        var peak = kb is null ? double.NaN : double.Parse(kb, CultureInfo.InvariantCulture) / 1024.0;
        return (seconds, process.ExitCode, peak);
    }

    /// <summary>Starts a command whose own process id is the returned one (the shell execs it).</summary>
    public static Process Start(string outFile, string errFile, params string[] command)
    {
        var info = new ProcessStartInfo("/bin/sh") { UseShellExecute = false };
        info.ArgumentList.Add("-c");
        info.ArgumentList.Add("o=$1; e=$2; shift 2; exec \"$@\" >\"$o\" 2>\"$e\" </dev/null");
        info.ArgumentList.Add("sh");
        info.ArgumentList.Add(outFile);
        info.ArgumentList.Add(errFile);
        foreach (var part in command)
        {
            info.ArgumentList.Add(part);
        }

        return Process.Start(info) ?? throw new InvalidOperationException("could not start " + command[0]);
    }

    /// <summary>Runs a command to the end and returns its stdout; throws when it fails.</summary>
    public static string Capture(string file, params string[] args)
    {
        var info = new ProcessStartInfo(file) { UseShellExecute = false, RedirectStandardOutput = true };
        foreach (var a in args)
        {
            info.ArgumentList.Add(a);
        }

        using var process = Process.Start(info)!;
        var text = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0)
        {
            throw new InvalidOperationException($"{file} {string.Join(' ', args)} exited with {process.ExitCode}");
        }

        return text;
    }

    /// <summary>Peak resident set so far (VmHWM, MB) of a live process.</summary>
    public static double PeakResidentMb(int pid)
    {
        foreach (var line in File.ReadLines($"/proc/{pid}/status"))
        {
            if (line.StartsWith("VmHWM:", StringComparison.Ordinal))
            {
                var kb = line["VmHWM:".Length..].Trim().Split(' ')[0];
                return double.Parse(kb, CultureInfo.InvariantCulture) / 1024.0;
            }
        }

        return double.NaN;
    }

    /// <summary>Asks a process to stop the way systemd does (SIGTERM) and waits for it.</summary>
    public static int Terminate(Process process, TimeSpan wait)
    {
        Capture("kill", "-TERM", process.Id.ToString(CultureInfo.InvariantCulture));
        if (!process.WaitForExit(wait))
        {
            process.Kill();
            process.WaitForExit();
            return -9;
        }

        return process.ExitCode;
    }
}
