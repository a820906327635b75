using BatchReconcile.Digest.Files;

namespace BatchReconcile.Digest.Tests.Files;

public class DigestFileNamesTests
{
    [Theory]
    [InlineData("North Plant", "digest-2026-11-25-north-plant")]
    [InlineData("", "digest-2026-11-25")]
    [InlineData("../../etc/passwd", "digest-2026-11-25-etc-passwd")]
    [InlineData("C:\\sites\\..\\x", "digest-2026-11-25-c-sites-x")]
    [InlineData("site\u0000name\r\n", "digest-2026-11-25-site-name")]
    [InlineData("...", "digest-2026-11-25")]
    [InlineData("Werk Köln 2", "digest-2026-11-25-werk-k-ln-2")]
    public void Names_are_built_from_the_day_and_a_safe_form_of_the_site(string site, string stem)
    {
        var names = DigestFileNames.For(new DateOnly(2026, 11, 25), site);
        Assert.Equal(stem + ".html", names.Html);
        Assert.Equal(stem + ".md", names.Markdown);
        Assert.Equal(stem + ".csv", names.Csv);
    }

    [Fact]
    public void A_long_site_name_is_shortened()
    {
        var slug = DigestFileNames.SiteSlug(new string('a', 300));
        Assert.Equal(DigestFileNames.MaxSiteLength, slug.Length);
    }
}
