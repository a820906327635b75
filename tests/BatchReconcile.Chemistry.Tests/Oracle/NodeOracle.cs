using System.Diagnostics;

namespace BatchReconcile.Chemistry.Tests.Oracle;

/// <summary>
/// Runs one script of the Node project in tests/oracle (independent npm packages, versions pinned
/// in its package-lock.json) and returns what it printed. A missing Node.js or package fails the
/// test with the setup step rather than skipping it.
/// </summary>
internal static class NodeOracle
{
    private const string Setup = "Run `npm ci --prefix tests/oracle` from the repository root (needs Node.js 20 and npm).";

    public static string Run(string script, string requiredPackage, string? stdin)
    {
        string oracleDir = Path.Combine(RepositoryRoot(), "tests", "oracle");
        string package = Path.Combine(oracleDir, "node_modules", requiredPackage);
        Assert.True(Directory.Exists(package), $"The oracle is not installed: {package} is missing. {Setup}");

        var start = new ProcessStartInfo("node", [Path.Combine(oracleDir, script)])
        {
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = oracleDir,
        };

        Process process;
        try
        {
            process = Process.Start(start) ?? throw new InvalidOperationException("node did not start");
        }
        catch (System.ComponentModel.Win32Exception ex)
        {
            Assert.Fail($"Could not run `node` ({ex.Message}). Install Node.js 20, then: {Setup}");
            throw;
        }

        using (process)
        {
            if (stdin is not null) process.StandardInput.Write(stdin);
            process.StandardInput.Close();
            var stderr = process.StandardError.ReadToEndAsync();
            string stdout = process.StandardOutput.ReadToEnd();
            Assert.True(process.WaitForExit(60_000), $"{script} did not finish within 60 s");
            Assert.True(process.ExitCode == 0, $"{script} failed (exit {process.ExitCode}): {stderr.Result}");
            return stdout;
        }
    }

    private static string RepositoryRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "BatchReconcile.sln"))) return dir.FullName;
        }

        throw new InvalidOperationException($"No BatchReconcile.sln above {AppContext.BaseDirectory}.");
    }
}
