using System.Text;

namespace BatchReconcile.Records.Tests.Definitions;

/// <summary>A real temporary "processes" folder whose files the test writes; deleted afterwards.</summary>
internal sealed class DefinitionFolder : IDisposable
{
    private readonly string _root;

    public DefinitionFolder()
    {
        _root = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "br-defs-" + Guid.NewGuid().ToString("N"));
        Path = System.IO.Path.Combine(_root, "processes");
        Directory.CreateDirectory(Path);
    }

    /// <summary>The folder; files appear in messages as "processes/NAME".</summary>
    public string Path { get; }

    public DefinitionFolder With(string fileName, string json)
    {
        File.WriteAllText(System.IO.Path.Combine(Path, fileName), json, new UTF8Encoding(encoderShouldEmitUTF8Identifier: false));
        return this;
    }

    public DefinitionFolder WithBytes(string fileName, byte[] content)
    {
        File.WriteAllBytes(System.IO.Path.Combine(Path, fileName), content);
        return this;
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(_root, recursive: true);
        }
        catch (IOException)
        {
            // A leftover temp folder is harmless; failing the test over it would hide the real result.
        }
    }
}
