using System.Globalization;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>
/// One data folder (<c>--data</c>) as the program lays it out with the repository's site settings:
/// inbox/, archive/YYYY/MM/DD/, quarantine/, batchreconcile.db. Looks at it from outside: the file
/// system, and the database opened read-only.
/// </summary>
public sealed class DataRoot(string path)
{
    public string Path { get; } = path;

    public string Inbox => System.IO.Path.Combine(Path, "inbox");

    public string Archive => System.IO.Path.Combine(Path, "archive");

    public string Quarantine => System.IO.Path.Combine(Path, "quarantine");

    public string Database => System.IO.Path.Combine(Path, "batchreconcile.db");

    /// <summary>Files in the inbox that the contract says are to be read (not dot-files, .part or .tmp).</summary>
    public IReadOnlyList<string> InboxCandidates() =>
        Names(Inbox, recursive: false).Where(n => !n.StartsWith('.') && !n.EndsWith(".part", StringComparison.OrdinalIgnoreCase) && !n.EndsWith(".tmp", StringComparison.OrdinalIgnoreCase)).ToList();

    /// <summary>Every file in the inbox, hidden ones included.</summary>
    public IReadOnlyList<string> InboxFiles() => Names(Inbox, recursive: false);

    /// <summary>Names of the files under archive/ (all date folders).</summary>
    public IReadOnlyList<string> ArchivedFiles() => Names(Archive, recursive: true);

    public IReadOnlyList<string> QuarantinedFiles() => Names(Quarantine, recursive: false);

    /// <summary>Runs a scalar query on the database, opened read-only without pooling (so no handle outlives the call).</summary>
    public long Scalar(string sql)
    {
        using var connection = Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return Convert.ToInt64(command.ExecuteScalar() ?? 0L, CultureInfo.InvariantCulture);
    }

    /// <summary>Rows of a query, each as its columns' text.</summary>
    public IReadOnlyList<string[]> Rows(string sql)
    {
        using var connection = Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        using var reader = command.ExecuteReader();
        var rows = new List<string[]>();
        while (reader.Read())
        {
            var row = new string[reader.FieldCount];
            for (var i = 0; i < row.Length; i++)
            {
                row[i] = reader.IsDBNull(i) ? "" : Convert.ToString(reader.GetValue(i), CultureInfo.InvariantCulture) ?? "";
            }

            rows.Add(row);
        }

        return rows;
    }

    /// <summary>Rows in the tables that hold stored batches; 0 when nothing of any file was stored.</summary>
    public long StoredRowCount() =>
        Scalar("SELECT (SELECT COUNT(*) FROM batch) + (SELECT COUNT(*) FROM batch_revision) + (SELECT COUNT(*) FROM raw_rows) + (SELECT COUNT(*) FROM step_result) + (SELECT COUNT(*) FROM flag)");

    private SqliteConnection Open()
    {
        if (!File.Exists(Database))
        {
            throw new FileNotFoundException($"no database at {Database}");
        }

        var connection = new SqliteConnection(new SqliteConnectionStringBuilder
        {
            DataSource = Database,
            Mode = SqliteOpenMode.ReadOnly,
            Pooling = false,
            DefaultTimeout = 30,
        }.ToString());
        connection.Open();
        return connection;
    }

    private static IReadOnlyList<string> Names(string folder, bool recursive) =>
        Directory.Exists(folder)
            ? Directory.EnumerateFiles(folder, "*", recursive ? SearchOption.AllDirectories : SearchOption.TopDirectoryOnly)
                .Select(f => System.IO.Path.GetFileName(f)).Order(StringComparer.Ordinal).ToList()
            : [];
}
