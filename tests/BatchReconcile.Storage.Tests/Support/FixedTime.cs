namespace BatchReconcile.Storage.Tests.Support;

/// <summary>A clock that says what the test wants.</summary>
internal sealed class FixedTime(DateTimeOffset now) : TimeProvider
{
    public DateTimeOffset Now { get; set; } = now;

    public override DateTimeOffset GetUtcNow() => Now;
}
