namespace BatchReconcile.Intake.Tests;

/// <summary>Generous deadlines: the tests check behaviour, not speed, and run on loaded machines.</summary>
internal static class Within
{
    public static readonly TimeSpan Deadline = TimeSpan.FromSeconds(30);

    /// <summary>A token that ends a wait that would otherwise hang the test run.</summary>
    public static CancellationToken Token() => new CancellationTokenSource(Deadline).Token;

    /// <summary>Polls until <paramref name="condition"/> holds; fails the test at the deadline.</summary>
    public static async Task UntilAsync(Func<bool> condition, string what)
    {
        var end = DateTime.UtcNow + Deadline;
        while (!condition())
        {
            Assert.True(DateTime.UtcNow < end, $"timed out waiting for: {what}");
            await Task.Delay(20);
        }
    }
}
