using BatchReconcile.Cli;

namespace BatchReconcile.Tests.Cli;

/// <summary>--json output carries values from files with control and bidi characters as \u escapes, never raw.</summary>
public class JsonOutputEscapingTests
{
    [Theory]
    [InlineData("\u001B[2J")]
    [InlineData("a\r\nb")]
    [InlineData("\u202Eevil")]
    [InlineData("\u2066x\u2069")]
    [InlineData("\u200Fmark")]
    [InlineData("c1\u0085")]
    public void Control_and_bidi_characters_are_escaped_in_json(string value)
    {
        using var output = new StringWriter();

        JsonOutput.Write(output, new { batch = value });

        Assert.DoesNotContain(output.ToString().TrimEnd(), c => BatchReconcile.Records.SafeText.IsRefused(c) && c is not '\n' and not '\r');
        Assert.DoesNotContain(output.ToString().Replace(Environment.NewLine, "", StringComparison.Ordinal), c => c is '\n' or '\r');
        using var parsed = System.Text.Json.JsonDocument.Parse(output.ToString());
        Assert.Equal(value, parsed.RootElement.GetProperty("batch").GetString());
    }
}
