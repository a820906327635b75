namespace BatchReconcile.Browser.Tests.Support;

/// <summary>Where screenshots and PDF prints are kept after a run, beside the test assembly.</summary>
public static class Artifacts
{
    public static string Folder { get; } = Directory.CreateDirectory(Path.Combine(AppContext.BaseDirectory, "artifacts", "browser")).FullName;

    public static string PathFor(string fileName) => Path.Combine(Folder, fileName);
}
