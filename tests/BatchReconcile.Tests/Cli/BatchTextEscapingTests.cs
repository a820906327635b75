using BatchReconcile.Cli;

namespace BatchReconcile.Tests.Cli;

/// <summary>`batches show` and `check` print a stored batch id escaped: ids stored before the reader
/// refused control characters (or written to the store some other way) cannot drive the terminal.</summary>
public class BatchTextEscapingTests
{
    [Fact]
    public void The_batch_header_escapes_control_and_bidi_characters()
    {
        var header = BatchText.Header("KB3\u001B[31m-0233\u202E", "PPZ-220\u0007", 1, BatchReconcile.Records.Exports.RecipeVersionSource.Export, new DateOnly(2026, 11, 24), null);

        Assert.Equal("batch KB3\\x1B[31m-0233\\u202E: recipe PPZ-220\\x07 v1, production day 2026-11-24; recipe version source: export", header);
    }
}
