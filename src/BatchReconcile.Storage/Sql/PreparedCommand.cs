using System.Data.Common;
using System.Globalization;
using Microsoft.Data.Sqlite;
using Npgsql;
using NpgsqlTypes;
using SQLitePCL;

namespace BatchReconcile.Storage.Sql;

/// <summary>
/// A parameterised statement compiled once and executed many times: the parameters are declared
/// with the command, and each execution only sets their values.
/// </summary>
/// <remarks>
/// <para>Statements that write or return one value (<see cref="Execute"/>, <see cref="Scalar"/>, <see cref="ReadFirst"/>)
/// are stepped directly through SQLitePCLRaw, the layer under Microsoft.Data.Sqlite, with each parameter's
/// index resolved once: ingestion runs them about fifteen times per file, and the command layer's work per
/// execution (finding every parameter by name, a data reader per statement) cost more than SQLite itself on
/// small files. <see cref="Read"/> still hands back a <see cref="SqliteDataReader"/> for the query code.</para>
/// <para>Both run the same SQL on the same connection, inside whatever transaction is open on it, with the
/// same values; errors are the same <see cref="SqliteException"/>s. The direct statement is always reset
/// after use, so it holds no lock between executions.</para>
/// <para>On PostgreSQL the same SQL runs through Npgsql (<see cref="PostgresSql.Parameters"/> turns the
/// <c>$name</c> parameters into Npgsql's <c>@name</c>); Npgsql prepares a statement on the server once it
/// has been used twice on a connection (<c>Max Auto Prepare</c>, set by <see cref="PostgresStore"/>).</para>
/// </remarks>
internal sealed class PreparedCommand : IDisposable
{
    private readonly SqliteConnection? _sqlite;
    private readonly DbCommand _command;
    private readonly string[] _names;
    private readonly SqliteType[] _types;
    private readonly object?[] _values;
    private readonly Dictionary<string, int> _positions;
    private sqlite3_stmt? _statement;
    private int[]? _indexes;

    public PreparedCommand(DbConnection connection, DbTransaction? transaction, string sql, params (string Name, SqliteType Type)[] parameters)
    {
        ArgumentNullException.ThrowIfNull(connection);
        _sqlite = connection as SqliteConnection;
        _command = connection.CreateCommand();
        _command.Transaction = transaction;
        _command.CommandText = _sqlite is null ? PostgresSql.Parameters(sql) : sql;
        _names = new string[parameters.Length];
        _types = new SqliteType[parameters.Length];
        _values = new object?[parameters.Length];
        _positions = new Dictionary<string, int>(parameters.Length, StringComparer.Ordinal);
        for (var i = 0; i < parameters.Length; i++)
        {
            (_names[i], _types[i]) = parameters[i];
            _positions.Add(_names[i], i);
            if (_command is SqliteCommand sqliteCommand)
            {
                sqliteCommand.Parameters.Add(_names[i], _types[i]);
            }
            else
            {
                _command.Parameters.Add(new NpgsqlParameter(_names[i].TrimStart('$'), PostgresType(_types[i])));
            }
        }
    }

    public PreparedCommand Set(string name, object? value)
    {
        _values[_positions.TryGetValue(name, out var i) ? i : throw new ArgumentException($"The statement has no parameter {name}.", nameof(name))] = value;
        return this;
    }

    public int Execute()
    {
        if (_sqlite is null)
        {
            BindCommand();
            return _command.ExecuteNonQuery();
        }

        var statement = Bound();
        try
        {
            int rc;
            while ((rc = raw.sqlite3_step(statement)) == raw.SQLITE_ROW)
            {
            }

            Check(rc);
            return raw.sqlite3_changes(_sqlite.Handle);
        }
        finally
        {
            raw.sqlite3_reset(statement);
        }
    }

    public object? Scalar() => ReadFirst(static row => row.Value(0));

    public long ScalarInt64() => Convert.ToInt64(Scalar() ?? throw new InvalidOperationException($"No value from: {_command.CommandText}"), CultureInfo.InvariantCulture);

    /// <summary>Runs the statement and maps its first row; the default of <typeparamref name="T"/> when it returns none.</summary>
    public T? ReadFirst<T>(Func<StatementRow, T> map)
    {
        ArgumentNullException.ThrowIfNull(map);
        if (_sqlite is null)
        {
            BindCommand();
            using var reader = _command.ExecuteReader();
            if (!reader.Read())
            {
                return default;
            }

            var first = map(new StatementRow(reader));
            while (reader.Read())
            {
            }

            return first;
        }

        var statement = Bound();
        try
        {
            var rc = raw.sqlite3_step(statement);
            if (rc == raw.SQLITE_ROW)
            {
                var value = map(new StatementRow(statement));
                while ((rc = raw.sqlite3_step(statement)) == raw.SQLITE_ROW)
                {
                }

                Check(rc);
                return value;
            }

            Check(rc);
            return default;
        }
        finally
        {
            raw.sqlite3_reset(statement);
        }
    }

    /// <summary>A reader over the rows, through the provider's ADO.NET command (dispose it before the next execution).</summary>
    public DbDataReader Read()
    {
        BindCommand();
        var reader = _command.ExecuteReader();
        return _sqlite is null ? new LenientReader(reader) : reader;
    }

    private void BindCommand()
    {
        for (var i = 0; i < _names.Length; i++)
        {
            _command.Parameters[i].Value = _sqlite is null ? PostgresValue(_values[i], _types[i]) : _values[i] ?? DBNull.Value;
        }
    }

    private static NpgsqlDbType PostgresType(SqliteType type) => type switch
    {
        SqliteType.Integer => NpgsqlDbType.Bigint,
        SqliteType.Real => NpgsqlDbType.Double,
        SqliteType.Blob => NpgsqlDbType.Bytea,
        _ => NpgsqlDbType.Text,
    };

    /// <summary>The value as the PostgreSQL schema stores it: whole numbers and flags (0/1) as bigint, as SQLite has them.</summary>
    private static object PostgresValue(object? value, SqliteType type) => value switch
    {
        null or DBNull => DBNull.Value,
        bool flag => flag ? 1L : 0L,
        int number when type != SqliteType.Real => (long)number,
        int number => (double)number,
        long number when type == SqliteType.Real => (double)number,
        double real when double.IsNaN(real) => throw new InvalidOperationException("NaN cannot be stored."),
        double real when type == SqliteType.Integer => checked((long)real),
        string or long or double or byte[] => value,
        _ => throw new NotSupportedException($"A value of type {value.GetType().Name} cannot be bound to a statement."),
    };

    public void Dispose()
    {
        _statement?.Dispose();
        _command.Dispose();
    }

    private sqlite3_stmt Bound()
    {
        if (_statement is null)
        {
            Check(raw.sqlite3_prepare_v2(_sqlite!.Handle, _command.CommandText, out var statement));
            _statement = statement;
            _indexes = new int[_names.Length];
            for (var i = 0; i < _names.Length; i++)
            {
                _indexes[i] = raw.sqlite3_bind_parameter_index(statement, _names[i]);
            }
        }

        for (var i = 0; i < _names.Length; i++)
        {
            var index = _indexes![i];
            if (index > 0)
            {
                Check(Bind(_statement, index, _values[i], _types[i]));
            }
        }

        return _statement;
    }

    private static int Bind(sqlite3_stmt statement, int index, object? value, SqliteType type) => value switch
    {
        null or DBNull => raw.sqlite3_bind_null(statement, index),
        string text => raw.sqlite3_bind_text(statement, index, text),
        long number => raw.sqlite3_bind_int64(statement, index, number),
        int number => raw.sqlite3_bind_int64(statement, index, number),
        bool flag => raw.sqlite3_bind_int64(statement, index, flag ? 1 : 0),
        double real when double.IsNaN(real) => throw new InvalidOperationException("NaN cannot be stored."),
        double real => type == SqliteType.Integer ? raw.sqlite3_bind_int64(statement, index, checked((long)real)) : raw.sqlite3_bind_double(statement, index, real),
        byte[] bytes => raw.sqlite3_bind_blob(statement, index, bytes),
        _ => throw new NotSupportedException($"A value of type {value.GetType().Name} cannot be bound to a statement."),
    };

    private void Check(int rc)
    {
        if (rc != raw.SQLITE_OK && rc != raw.SQLITE_DONE && rc != raw.SQLITE_ROW)
        {
            SqliteException.ThrowExceptionForRC(rc, _sqlite!.Handle);
        }
    }
}

/// <summary>The current row of a statement stepped by <see cref="PreparedCommand.ReadFirst"/>.</summary>
/// <remarks>On PostgreSQL it reads the command's data reader instead.</remarks>
internal readonly struct StatementRow
{
    private readonly sqlite3_stmt? _statement;
    private readonly DbDataReader? _reader;

    internal StatementRow(sqlite3_stmt statement) => _statement = statement;

    internal StatementRow(DbDataReader reader) => _reader = reader;

    public bool IsNull(int column) => _reader?.IsDBNull(column) ?? raw.sqlite3_column_type(_statement, column) == raw.SQLITE_NULL;

    public long GetInt64(int column) => _reader is null ? raw.sqlite3_column_int64(_statement, column) : IsNull(column) ? 0 : Convert.ToInt64(_reader.GetValue(column), CultureInfo.InvariantCulture);

    public int GetInt32(int column) => checked((int)GetInt64(column));

    public string GetString(int column) => _reader is null
        ? raw.sqlite3_column_text(_statement, column).utf8_to_string() ?? string.Empty
        : IsNull(column) ? string.Empty : _reader.GetString(column);

    public string? NullableString(int column) => IsNull(column) ? null : GetString(column);

    /// <summary>The value as Microsoft.Data.Sqlite's ExecuteScalar gives it: long, double, string, byte[] or null.</summary>
    public object? Value(int column) => _reader is not null
        ? (IsNull(column) ? null : _reader.GetValue(column))
        : raw.sqlite3_column_type(_statement, column) switch
    {
        raw.SQLITE_INTEGER => raw.sqlite3_column_int64(_statement, column),
        raw.SQLITE_FLOAT => raw.sqlite3_column_double(_statement, column),
        raw.SQLITE_TEXT => GetString(column),
        raw.SQLITE_BLOB => raw.sqlite3_column_blob(_statement, column).ToArray(),
        _ => null,
    };
}
