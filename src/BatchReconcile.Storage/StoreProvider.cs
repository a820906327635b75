namespace BatchReconcile.Storage;

/// <summary>The database behind the store (<c>Storage:Provider</c>).</summary>
public enum StoreProvider
{
    /// <summary>One SQLite file next to the service: one building, one machine (the default).</summary>
    Sqlite,

    /// <summary>A PostgreSQL database shared by the sites and instances of a company; each site has its own schema.</summary>
    Postgresql,
}
