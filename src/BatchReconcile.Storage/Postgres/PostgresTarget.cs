using System.Globalization;
using System.Text.RegularExpressions;
using Npgsql;

namespace BatchReconcile.Storage;

/// <summary>
/// Where a site's store lives in PostgreSQL: the server and database of the connection string, and the
/// site's own schema (<c>site_</c> and the site code) in it.
/// </summary>
/// <remarks>
/// One schema per site keeps every site's SHA-256 idempotency, batch revisions, flags, digests and audit chain
/// apart by construction, with the same tables and SQL as the SQLite file of one site.
/// </remarks>
internal sealed partial class PostgresTarget
{
    private PostgresTarget(string connectionString, string schema, string siteCode, string description)
    {
        ConnectionString = connectionString;
        Schema = schema;
        SiteCode = siteCode;
        Description = description;
    }

    /// <summary>The connection string with the site's schema as search path (holds the password: never log it).</summary>
    public string ConnectionString { get; }

    public string Schema { get; }

    public string SiteCode { get; }

    /// <summary>Server, port, database, user and schema, for messages; no password.</summary>
    public string Description { get; }

    /// <summary>What is wrong with a connection string, or null; the message never repeats the string.</summary>
    public static string? ProblemOf(string connectionString)
    {
        try
        {
            var builder = new NpgsqlConnectionStringBuilder(connectionString);
            return string.IsNullOrWhiteSpace(builder.Host) ? "names no Host." : null;
        }
        catch (ArgumentException e)
        {
            // Npgsql's message names the keyword it does not know, not the values.
            return "is not a valid Npgsql connection string: " + e.Message;
        }
    }

    /// <summary>True when a site code can name a schema: a letter, then up to 39 letters, digits, '-' or '_'.</summary>
    public static bool IsValidSiteCode(string? code) => code is not null && SiteCodePattern().IsMatch(code);

    public static PostgresTarget From(string connectionString, string siteCode, StoreSettings settings)
    {
        if (ProblemOf(connectionString) is { } problem)
        {
            throw new StoreException("Storage:ConnectionString " + problem);
        }

        if (!IsValidSiteCode(siteCode))
        {
            throw new StoreException(
                $"Site:Code '{siteCode}' cannot name the site's schema: give a letter followed by up to 39 letters, digits, '-' or '_' (e.g. KB3).");
        }

        var schema = "site_" + siteCode.ToLowerInvariant().Replace('-', '_');
        var builder = new NpgsqlConnectionStringBuilder(connectionString)
        {
            SearchPath = schema,
            // Statements used twice on a connection are prepared on the server (the commit path runs the same
            // fifteen statements for every file).
            MaxAutoPrepare = 64,
            AutoPrepareMinUsages = 2,
            // A lock wait or statement is bounded like SQLite's busy timeout.
            CommandTimeout = Math.Max(30, (int)Math.Ceiling(settings.BusyTimeoutSeconds)),
            ApplicationName = "batchreconcile",
            IncludeErrorDetail = false,
        };
        var port = builder.Port.ToString(CultureInfo.InvariantCulture);
        var description = $"PostgreSQL {builder.Host}:{port}/{builder.Database ?? builder.Username}, schema {schema} (user {builder.Username})";
        return new PostgresTarget(builder.ConnectionString, schema, siteCode, description);
    }

    [GeneratedRegex("^[A-Za-z][A-Za-z0-9_-]{0,39}$", RegexOptions.CultureInvariant)]
    private static partial Regex SiteCodePattern();
}
