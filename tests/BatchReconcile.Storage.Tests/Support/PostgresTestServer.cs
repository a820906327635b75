using Npgsql;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>
/// The PostgreSQL server of the tests: the throw-away cluster that <c>scripts/test</c> (and so CI) starts
/// with <c>scripts/pg-cluster</c>, named by <c>BATCHRECONCILE_TEST_POSTGRES</c> (an Npgsql connection string
/// of a role that may create databases). The tests use one database of their own, <c>batchreconcile_tests</c>,
/// and each test a site schema of its own in it.
/// </summary>
/// <remarks>Without the variable a PostgreSQL test fails and says how to get a server; it is never skipped.</remarks>
public static class PostgresTestServer
{
    public const string Variable = "BATCHRECONCILE_TEST_POSTGRES";
    private const string Database = "batchreconcile_tests";
    private static readonly Lazy<string> Tests = new(CreateDatabase, LazyThreadSafetyMode.ExecutionAndPublication);

    /// <summary>The connection string of the server's maintenance database, from the environment.</summary>
    public static string Admin => Environment.GetEnvironmentVariable(Variable) is { Length: > 0 } value
        ? value
        : throw new InvalidOperationException(
            $"{Variable} is not set: the PostgreSQL tests need a server. Run the tests with scripts/test, which starts a " +
            "throw-away cluster (scripts/pg-cluster; Debian package postgresql), or set the variable to an Npgsql connection string.");

    /// <summary>The connection string of the tests' own database (created on first use).</summary>
    public static string ConnectionString => Tests.Value;

    /// <summary>A new site code no other test uses.</summary>
    public static string NewSiteCode() => "t" + Guid.NewGuid().ToString("N")[..20];

    /// <summary>Drops a site's schema with everything in it.</summary>
    public static void DropSite(string siteCode)
    {
        using var connection = new NpgsqlConnection(ConnectionString);
        connection.Open();
        using var command = new NpgsqlCommand($"DROP SCHEMA IF EXISTS site_{siteCode.ToLowerInvariant()} CASCADE", connection);
        command.ExecuteNonQuery();
    }

    private static string CreateDatabase()
    {
        using (var connection = new NpgsqlConnection(Admin))
        {
            connection.Open();
            using var exists = new NpgsqlCommand("SELECT 1 FROM pg_database WHERE datname = @name", connection);
            exists.Parameters.AddWithValue("name", Database);
            if (exists.ExecuteScalar() is null)
            {
                using var create = new NpgsqlCommand($"CREATE DATABASE {Database} TEMPLATE template0 ENCODING 'UTF8' LC_COLLATE 'C' LC_CTYPE 'C'", connection);
                try
                {
                    create.ExecuteNonQuery();
                }
                catch (PostgresException e) when (e.SqlState is "42P04" or "23505")
                {
                    // Another test process created it at the same moment.
                }
            }
        }

        return new NpgsqlConnectionStringBuilder(Admin) { Database = Database }.ConnectionString;
    }
}
