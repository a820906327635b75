namespace BatchReconcile.Browser.Tests.Support;

/// <summary>
/// The browser tests share one Chromium and one run of the demo, and run one after another (the machines have two cores).
/// </summary>
[CollectionDefinition(Name)]
public sealed class ChromiumCollection : ICollectionFixture<ChromiumFixture>, ICollectionFixture<DemoDigest>
{
    public const string Name = "Chromium";
}
