using BatchReconcile.Intake.Inbox;

namespace BatchReconcile.Intake.Tests.Inbox;

public class InboxFileNameTests
{
    // The export contract: names starting with '.' or ending in .part/.tmp are never read.
    [Theory]
    [InlineData("AP-2611-014.csv", true)]
    [InlineData("export 2026-11-24.CSV", true)]
    [InlineData("notes.txt", true)]
    [InlineData("AP-2611-014.csv.part", false)]
    [InlineData("AP-2611-014.csv.PART", false)]
    [InlineData("AP-2611-014.csv.tmp", false)]
    [InlineData("AP-2611-014.Tmp", false)]
    [InlineData(".AP-2611-014.csv", false)]
    [InlineData(".hidden", false)]
    [InlineData("part", true)]
    [InlineData("file.partial", true)]
    [InlineData("", false)]
    public void Only_complete_visible_names_are_candidates(string name, bool expected)
    {
        Assert.Equal(expected, InboxFileName.IsCandidate(name));
    }
}
