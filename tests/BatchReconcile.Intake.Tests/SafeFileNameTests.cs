namespace BatchReconcile.Intake.Tests;

public class SafeFileNameTests
{
    [Theory]
    [InlineData("AP-2611-014", "AP-2611-014")]
    [InlineData("ANL-200 S1", "ANL-200 S1")]
    [InlineData("a/b\\c", "a_b_c")]
    [InlineData("../../etc/passwd", "_._._etc_passwd")]
    [InlineData("lot..7", "lot.7")]
    [InlineData(".hidden", "_hidden")]
    [InlineData("  padded  ", "padded")]
    [InlineData("trailing...", "trailing")]
    [InlineData("a:b*c?d\"e<f>g|h", "a_b_c_d_e_f_g_h")]
    [InlineData("tab\there\nnewline", "tab_here_newline")]
    [InlineData("", "_")]
    [InlineData("...", "_")]
    [InlineData("CON", "_CON")]
    [InlineData("nul.csv", "_nul.csv")]
    [InlineData("Δ-lot µ", "Δ-lot µ")]
    public void Names_from_data_become_one_safe_component(string text, string expected)
    {
        var safe = SafeFileName.From(text);

        Assert.Equal(expected, safe);
        Assert.DoesNotContain("..", safe, StringComparison.Ordinal);
        Assert.DoesNotContain('/', safe);
        Assert.DoesNotContain('\\', safe);
    }

    [Fact]
    public void Long_names_are_cut_on_a_character_boundary_within_the_byte_limit()
    {
        var safe = SafeFileName.From(new string('µ', 200));

        Assert.Equal(SafeFileName.MaxBytes / 2, safe.Length);
        Assert.True(System.Text.Encoding.UTF8.GetByteCount(safe) <= SafeFileName.MaxBytes);
    }
}
