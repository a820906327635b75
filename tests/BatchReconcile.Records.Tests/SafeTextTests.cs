namespace BatchReconcile.Records.Tests;

/// <summary>The one escaping of control characters used wherever free text is printed or logged.
/// Ranges: C0 and C1 controls and DEL (ISO/IEC 6429), bidirectional controls (Unicode UAX #9).</summary>
public class SafeTextTests
{
    public static TheoryData<string, string> Escapes => new()
    {
        { "plain text", "plain text" },
        { "caf\u00E9 \u00B5g \u4E2D", "caf\u00E9 \u00B5g \u4E2D" },
        { "a\u001B[2Jb", "a\\x1B[2Jb" },
        { "line\r\nforged", "line\\x0D\\x0Aforged" },
        { "bell\u0007", "bell\\x07" },
        { "nul\u0000", "nul\\x00" },
        { "tab\there", "tab\\x09here" },
        { "del\u007F c1\u0085 \u009F", "del\\x7F c1\\x85 \\x9F" },
        { "\u202Eevil", "\\u202Eevil" },
        { "\u200E\u200F\u202A\u202B\u202C\u202D", "\\u200E\\u200F\\u202A\\u202B\\u202C\\u202D" },
        { "\u2066\u2067\u2068\u2069", "\\u2066\\u2067\\u2068\\u2069" },
        { "\u00A0 no-break space and \u200B zero width space stay", "\u00A0 no-break space and \u200B zero width space stay" },
    };

    [Theory]
    [MemberData(nameof(Escapes))]
    public void Control_and_bidi_characters_are_written_as_visible_escapes(string text, string expected)
    {
        Assert.Equal(expected, SafeText.Escape(text));
        Assert.Equal(expected == text ? -1 : SafeText.IndexOfRefused(text), SafeText.IndexOfRefused(text));
        Assert.DoesNotContain(SafeText.Escape(text), SafeText.IsRefused);
    }

    [Fact]
    public void A_prefix_does_not_split_a_surrogate_pair()
    {
        var text = new string('a', 9) + "\U0001F600" + "tail";

        Assert.Equal(new string('a', 9) + "...", SafeText.Prefix(text, 10));
        Assert.Equal("short", SafeText.Prefix("short", 10));
    }
}
