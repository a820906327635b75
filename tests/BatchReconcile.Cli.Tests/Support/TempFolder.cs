namespace BatchReconcile.Cli.Tests.Support;

/// <summary>A fresh folder under the system temp folder, deleted with everything in it on dispose.</summary>
public sealed class TempFolder : IDisposable
{
    public TempFolder(string prefix = "brc-test")
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), $"{prefix}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    /// <summary>A path below this folder (not created).</summary>
    public string Sub(params string[] parts) => System.IO.Path.Combine([Path, .. parts]);

    public void Dispose()
    {
        // A process that was killed may still be letting go of its files for a moment; retry briefly.
        for (var attempt = 0; attempt < 5; attempt++)
        {
            try
            {
                if (Directory.Exists(Path))
                {
                    Directory.Delete(Path, recursive: true);
                }

                return;
            }
            catch (IOException) when (attempt < 4)
            {
                Thread.Sleep(200);
            }
            catch (UnauthorizedAccessException) when (attempt < 4)
            {
                Thread.Sleep(200);
            }
        }
    }
}
