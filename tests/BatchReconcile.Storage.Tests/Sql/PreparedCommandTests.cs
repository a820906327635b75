using BatchReconcile.Storage.Sql;
using BatchReconcile.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Sql;

/// <summary>
/// <see cref="PreparedCommand"/> steps writes and single-row reads directly through SQLitePCLRaw: what it
/// stores and reads back must be what the Microsoft.Data.Sqlite command would have stored and read.
/// </summary>
public sealed class PreparedCommandTests
{
    public static TheoryData<string, object?> Values => new()
    {
        { "null", null },
        { "text", "Kestrel Bay ÄÖ µ 反应 \"quoted\"" },
        { "empty text", "" },
        { "long", 9_007_199_254_740_993L },
        { "int", -42 },
        { "bool", true },
        { "double", 1234.5678901234567 },
        { "negative zero", -0.0 },
        { "blob", new byte[] { 0, 1, 2, 254, 255 } },
    };

    [Theory]
    [MemberData(nameof(Values))]
    public void A_value_bound_directly_reads_back_as_the_data_provider_stores_and_reads_it(string what, object? value)
    {
        using var db = new TempDatabase();
        using var connection = OpenScratch(db);
        Db.Execute(connection, "CREATE TABLE t (id INTEGER PRIMARY KEY, v)");

        using (var insert = new PreparedCommand(connection, null, "INSERT INTO t (id, v) VALUES ($id, $v)", ("$id", SqliteType.Integer), ("$v", SqliteType.Text)))
        {
            Assert.Equal(1, insert.Set("$id", 1L).Set("$v", value).Execute());
        }

        // The reference: the same value through Microsoft.Data.Sqlite's own parameter binding.
        using (var provider = connection.CreateCommand())
        {
            provider.CommandText = "INSERT INTO t (id, v) VALUES (2, $v)";
            provider.Parameters.AddWithValue("$v", value ?? DBNull.Value);
            provider.ExecuteNonQuery();
        }

        var stored = Db.Scalar(connection, "SELECT typeof(v) || ':' || quote(v) FROM t WHERE id = 1");
        var reference = Db.Scalar(connection, "SELECT typeof(v) || ':' || quote(v) FROM t WHERE id = 2");
        Assert.True(stored == reference, $"{what}: stored {stored}, the data provider stores {reference}");

        using var read = new PreparedCommand(connection, null, "SELECT v FROM t WHERE id = $id", ("$id", SqliteType.Integer));
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT v FROM t WHERE id = 2";
        var expected = command.ExecuteScalar();
        Assert.Equal(expected is DBNull ? null : expected, read.Set("$id", 1L).Scalar());
    }

    [Fact]
    public void A_statement_that_breaks_a_constraint_throws_the_same_sqlite_exception_and_leaves_the_statement_usable()
    {
        using var db = new TempDatabase();
        using var connection = OpenScratch(db);
        Db.Execute(connection, "CREATE TABLE t (id INTEGER PRIMARY KEY, v TEXT NOT NULL UNIQUE)");
        using var insert = new PreparedCommand(connection, null, "INSERT INTO t (v) VALUES ($v) RETURNING id", ("$v", SqliteType.Text));

        Assert.Equal(1, insert.Set("$v", "a").ScalarInt64());
        var refused = Assert.Throws<SqliteException>(() => insert.Set("$v", "a").ScalarInt64());

        // SQLITE_CONSTRAINT = 19, SQLITE_CONSTRAINT_UNIQUE = 2067 (sqlite.org/rescode.html).
        Assert.Equal((19, 2067), (refused.SqliteErrorCode, refused.SqliteExtendedErrorCode));
        Assert.Contains("UNIQUE", refused.Message, StringComparison.Ordinal);
        Assert.Equal(2, insert.Set("$v", "b").ScalarInt64());
        Assert.Equal("2", Db.Scalar(connection, "SELECT count(*) FROM t"));
    }

    [Fact]
    public void ReadFirst_maps_the_first_row_or_gives_the_default_and_Read_sees_the_same_values()
    {
        using var db = new TempDatabase();
        using var connection = OpenScratch(db);
        Db.Execute(connection, "CREATE TABLE t (id INTEGER PRIMARY KEY, v TEXT); INSERT INTO t VALUES (1, 'one'), (2, NULL), (3, 'three')");
        using var query = new PreparedCommand(connection, null, "SELECT id, v FROM t WHERE id >= $from ORDER BY id", ("$from", SqliteType.Integer));

        Assert.Equal((1L, "one"), query.Set("$from", 1).ReadFirst(static row => (row.GetInt64(0), row.NullableString(1))));
        Assert.Equal((2L, (string?)null), query.Set("$from", 2).ReadFirst(static row => (row.GetInt64(0), row.NullableString(1))));
        Assert.Equal(default, query.Set("$from", 9).ReadFirst(static row => (row.GetInt64(0), row.NullableString(1))));

        using var reader = query.Set("$from", 2).Read();
        var ids = new List<long>();
        while (reader.Read())
        {
            ids.Add(reader.GetInt64(0));
        }

        Assert.Equal([2L, 3L], ids);
    }

    [Fact]
    public void A_parameter_the_statement_does_not_declare_is_refused()
    {
        using var db = new TempDatabase();
        using var connection = OpenScratch(db);
        using var query = new PreparedCommand(connection, null, "SELECT $a", ("$a", SqliteType.Integer));
        Assert.Throws<ArgumentException>(() => query.Set("$b", 1));
    }

    private static SqliteConnection OpenScratch(TempDatabase db)
    {
        var connection = new SqliteConnection($"Data Source={db.DatabasePath}.scratch;Pooling=False");
        connection.Open();
        return connection;
    }
}
