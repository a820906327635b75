using BatchReconcile.Digest.Rendering;

namespace BatchReconcile.Digest.Tests.Rendering;

public class MarkdownEscapeTests
{
    [Theory]
    [InlineData("B|7", "B\\|7")]
    [InlineData("`rm -rf`", "\\`rm -rf\\`")]
    [InlineData("<script>", "&lt;script&gt;")]
    [InlineData("a\\b", "a\\\\b")]
    [InlineData("*bold* _it_", "\\*bold\\* \\_it\\_")]
    [InlineData("[x](javascript:1)", "\\[x\\](javascript:1)")]
    [InlineData("line\nbreak", "line break")]
    [InlineData("R&D", "R&amp;D")]
    [InlineData("PX-204 S2", "PX-204 S2")]
    public void Cell_text_is_escaped(string text, string expected) => Assert.Equal(expected, MarkdownDigestRenderer.E(text));
}
