namespace BatchReconcile.Records.Tests.Definitions;

internal static class RepositoryFolder
{
    /// <summary>The checkout's root: the first folder above the test binaries that holds BatchReconcile.sln.</summary>
    public static string Root { get; } = Find();

    private static string Find()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "BatchReconcile.sln")))
            {
                return dir.FullName;
            }
        }

        throw new InvalidOperationException($"No BatchReconcile.sln above {AppContext.BaseDirectory}.");
    }
}
