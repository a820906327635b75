using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Sql;

/// <summary>
/// A parameterised statement compiled once and executed many times: the parameters are created
/// with the command, and each execution only sets their values.
/// </summary>
internal sealed class PreparedCommand : IDisposable
{
    private readonly SqliteCommand _command;

    public PreparedCommand(SqliteConnection connection, SqliteTransaction? transaction, string sql, params (string Name, SqliteType Type)[] parameters)
    {
        _command = connection.CreateCommand();
        _command.Transaction = transaction;
        _command.CommandText = sql;
        foreach (var (name, type) in parameters)
        {
            _command.Parameters.Add(name, type);
        }

        _command.Prepare();
    }

    public PreparedCommand Set(string name, object? value)
    {
        _command.Parameters[name].Value = value ?? DBNull.Value;
        return this;
    }

    public int Execute() => _command.ExecuteNonQuery();

    public object? Scalar()
    {
        var value = _command.ExecuteScalar();
        return value is DBNull ? null : value;
    }

    public long ScalarInt64() => Convert.ToInt64(Scalar() ?? throw new InvalidOperationException($"No value from: {_command.CommandText}"), System.Globalization.CultureInfo.InvariantCulture);

    public SqliteDataReader Read() => _command.ExecuteReader();

    public void Dispose() => _command.Dispose();
}
