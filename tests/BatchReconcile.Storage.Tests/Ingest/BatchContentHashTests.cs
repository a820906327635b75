using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Ingest;

public sealed class BatchContentHashTests
{
    private static readonly BatchRecord Original = Build.Batch("BZ-001");

    public static TheoryData<string, BatchRecord> SameContent() => new()
    {
        { "other line numbers", Build.Batch("BZ-001", firstLine: 120) },
        { "rows in another order", Original with { Rows = Original.Rows.Reverse().ToList() } },
        { "a number written differently", ReplaceProduct(95.0, "95.000", keepOffset: true) },
        { "the same time in another offset", ReplaceProduct(95.0, "95", keepOffset: false) },
        { "an extra column outside the contract", Original with { Rows = Original.Rows.Select(r => r with { Raw = [.. r.Raw, new("operator", "JK")] }).ToList() } },
    };

    public static TheoryData<string, BatchRecord> ChangedContent() => new()
    {
        { "a corrected quantity", Build.Batch("BZ-001", productKg: 95.5) },
        { "a row removed", Original with { Rows = Original.Rows.Skip(1).ToList() } },
        { "a row repeated (a second drum of the same charge)", Original with { Rows = [.. Original.Rows, Original.Rows[0] with { Line = 99 }] } },
        { "another recipe version", Build.Batch("BZ-001", recipeVersion: 2) },
        { "another batch id", Build.Batch("BZ-002") },
        { "another stream label", Original with { Rows = Original.Rows.Select(r => r.Stream is null ? r : r with { Stream = "aqueous layer" }).ToList() } },
    };

    [Theory]
    [MemberData(nameof(SameContent))]
    public void Layout_differences_keep_the_hash(string change, BatchRecord other)
    {
        Assert.True(BatchContentHash.Compute(Original) == BatchContentHash.Compute(other), change);
    }

    [Theory]
    [MemberData(nameof(ChangedContent))]
    public void Content_differences_change_the_hash(string change, BatchRecord other)
    {
        Assert.True(BatchContentHash.Compute(Original) != BatchContentHash.Compute(other), change);
    }

    /// <summary>
    /// The hashes of stored revisions are compared with those of new exports: any change to the canonical
    /// form (escaping, number form, order) would make every re-export of an unchanged batch a new revision.
    /// The values were computed by the first implementation (JsonSerializer over object arrays) and are pinned.
    /// </summary>
    [Theory]
    [MemberData(nameof(Pinned))]
    public void The_canonical_form_does_not_change(string name, BatchRecord batch, string expected)
    {
        Assert.True(expected == BatchContentHash.Compute(batch), name + ": " + BatchContentHash.Compute(batch));
    }

    public static TheoryData<string, BatchRecord, string> Pinned() => new()
    {
        { "two-step batch", Original, "3eb0746ab4f6b94095932e130f92f1c97b538914cebe7b3932a1f32be9bf4082" },
        { "text that JSON escapes", Escaping, "01a3ef32ad33a2f978bf3a78ac9a1aee3a616b7f37597602dc0a750729713a87" },
    };

    /// <summary>Quotes, backslash, markup characters, non-ASCII letters, a control character and a symbol outside the BMP.</summary>
    private static readonly BatchRecord Escaping = Original with
    {
        BatchId = "BZ-\"Ä\"<&>'+",
        Rows = Original.Rows.Select((r, i) => r with
        {
            Stream = i == 4 ? "Mutterlauge \\ ß\t𝛼" : r.Stream,
            Lot = i == 0 ? "lot-é/1" : null,
            AssayPct = i == 1 ? 99.125 : null,
            Quantity = i == 2 ? 1e-7 : r.Quantity,
        }).ToList(),
    };

    [Fact]
    public void The_hash_is_64_lower_case_hex_digits()
    {
        Assert.Matches("^[0-9a-f]{64}$", BatchContentHash.Compute(Original));
    }

    private static BatchRecord ReplaceProduct(double kg, string text, bool keepOffset) => Original with
    {
        Rows = Original.Rows.Select(r => r.Entry == EntryKind.Product && r.Step == "S1"
            ? Build.Row(r.Line, r.Batch, r.Step, r.Entry, r.Material, kg, recordedAt: keepOffset ? r.RecordedAt : r.RecordedAt!.Value.ToOffset(TimeSpan.FromHours(-5)), quantityText: text)
            : r).ToList(),
    };
}
