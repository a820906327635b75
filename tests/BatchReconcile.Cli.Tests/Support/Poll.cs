namespace BatchReconcile.Cli.Tests.Support;

/// <summary>Waits for a condition by looking again and again until a deadline; never a fixed sleep.</summary>
public static class Poll
{
    public static async Task UntilAsync(Func<bool> condition, TimeSpan timeout, Func<string> describe, int intervalMs = 50)
    {
        var deadline = DateTime.UtcNow + timeout;
        while (!condition())
        {
            if (DateTime.UtcNow > deadline)
            {
                throw new TimeoutException($"not reached within {timeout.TotalSeconds} s: {describe()}");
            }

            await Task.Delay(intervalMs);
        }
    }
}
