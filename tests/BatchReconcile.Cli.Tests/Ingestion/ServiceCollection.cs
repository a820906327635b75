namespace BatchReconcile.Cli.Tests.Ingestion;

/// <summary>
/// The tests that run the service as a long-running process share this collection so that they do
/// not run at the same time as each other: on a small machine several services and a 150-file
/// backlog at once would only stretch every timing.
/// </summary>
[CollectionDefinition(Name)]
public sealed class ServiceCollection
{
    public const string Name = "service processes";
}
