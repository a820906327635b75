using System.Data.Common;
using System.Globalization;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Sql;

/// <summary>How values are written to and read from the database's columns.</summary>
internal static class DbText
{
    // Fixed width with a 'Z' so that text order is time order.
    private const string TimeFormat = "yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'";
    private const string DayFormat = "yyyy-MM-dd";

    public static string Time(DateTimeOffset value) =>
        value.UtcDateTime.ToString(TimeFormat, CultureInfo.InvariantCulture);

    public static object TimeOrNull(DateTimeOffset? value) => value is { } v ? Time(v) : DBNull.Value;

    public static string Day(DateOnly day) => day.ToString(DayFormat, CultureInfo.InvariantCulture);

    public static DateTimeOffset ParseTime(string text) =>
        DateTimeOffset.ParseExact(text, TimeFormat, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal);

    public static DateOnly ParseDay(string text) => DateOnly.ParseExact(text, DayFormat, CultureInfo.InvariantCulture);

    public static string? NullableString(this DbDataReader reader, int ordinal) =>
        reader.IsDBNull(ordinal) ? null : reader.GetString(ordinal);

    public static double? NullableDouble(this DbDataReader reader, int ordinal) =>
        reader.IsDBNull(ordinal) ? null : reader.GetDouble(ordinal);

    public static DateTimeOffset? NullableTime(this DbDataReader reader, int ordinal) =>
        reader.IsDBNull(ordinal) ? null : ParseTime(reader.GetString(ordinal));
}
