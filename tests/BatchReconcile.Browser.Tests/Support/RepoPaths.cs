namespace BatchReconcile.Browser.Tests.Support;

/// <summary>Finds the repository and the built program from the test's own output folder.</summary>
public static class RepoPaths
{
    public static string Root { get; } = FindRoot();

    private static string FindRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "BatchReconcile.sln")))
            {
                return dir.FullName;
            }
        }

        throw new InvalidOperationException($"BatchReconcile.sln not found above {AppContext.BaseDirectory}");
    }

    /// <summary>
    /// The program built by the same configuration as this test assembly
    /// (tests/X/bin/{Configuration}/{tfm}/ → src/BatchReconcile/bin/{Configuration}/{tfm}/).
    /// </summary>
    public static string ProgramDll
    {
        get
        {
            var tfmDir = new DirectoryInfo(AppContext.BaseDirectory.TrimEnd(Path.DirectorySeparatorChar));
            var configuration = tfmDir.Parent!.Name;
            var path = Path.Combine(Root, "src", "BatchReconcile", "bin", configuration, tfmDir.Name, "batchreconcile.dll");
            return File.Exists(path)
                ? path
                : throw new FileNotFoundException($"the program is not built for {configuration}: {path}");
        }
    }
}
