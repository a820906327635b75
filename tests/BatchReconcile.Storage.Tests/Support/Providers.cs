using BatchReconcile.Storage;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>
/// The providers every provider-neutral test runs on (<c>[MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]</c>);
/// shared with the host tests, which link this file.
/// </summary>
public static class Providers
{
    public static TheoryData<StoreProvider> Both => new() { StoreProvider.Sqlite, StoreProvider.Postgresql };
}
