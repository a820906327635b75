using BatchReconcile.Storage.Sql;

namespace BatchReconcile.Storage.Tests.Sql;

/// <summary>Raw rows come back exactly as read: line numbers, column names, their order and the values.</summary>
public sealed class RawRowsJsonTests
{
    private static KeyValuePair<string, string> F(string name, string value) => new(name, value);

    public static TheoryData<string, (int Line, KeyValuePair<string, string>[] Fields)[]> Cases() => new()
    {
        { "one header for every row", [(2, [F("batch", "BZ-1"), F("quantity", "100.0")]), (3, [F("batch", "BZ-1"), F("quantity", "")])] },
        { "text JSON escapes or keeps", [(7, [F("stream", "Mutterlauge \"ä\" \\ 1+1 <b>&\t\u0001 𝛼")]), (9, [F("stream", "")])] },
        { "a later row with one more column", [(2, [F("batch", "A")]), (3, [F("batch", "A"), F("operator", "JK")]), (4, [F("batch", "A")])] },
        { "a repeated column name in the first row", [(2, [F("note", "x"), F("note", "y")])] },
        { "no rows", [] },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Rows_round_trip(string name, (int Line, KeyValuePair<string, string>[] Fields)[] rows)
    {
        var stored = RawRowsJson.Encode(rows, r => r.Line, r => r.Fields);
        var back = RawRowsJson.Decode(stored.Header, stored.Lines);

        Assert.True(rows.Length == stored.LineCount, name);
        Assert.Equal(rows.Select(r => r.Line), back.Select(r => r.Line));
        Assert.Equal(rows.Select(r => r.Fields.ToList()), back.Select(r => r.Fields.ToList()));
    }

    [Fact]
    public void The_lines_are_compressed()
    {
        var rows = Enumerable.Range(2, 40).Select(line => (Line: line, Fields: new[] { F("batch", "NB-0163"), F("recipe", "NBB-150"), F("step", "S1"), F("entry", "charge"), F("quantity", "412.5"), F("unit", "kg") })).ToList();
        var stored = RawRowsJson.Encode(rows, r => r.Line, r => r.Fields);
        var json = System.Text.Json.JsonSerializer.Serialize(rows.Select(r => r.Fields.Select(f => f.Value)));
        Assert.True(stored.Lines.Length * 3 < json.Length, $"{stored.Lines.Length} compressed bytes for {json.Length} characters of values");
    }
}
