using System.Globalization;

namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>
/// A clean batch of one sample recipe, read from the demo plant's exports (sample-data/inbox), from which
/// synthetic batches are derived. Scaling every quantity of a batch by one factor keeps the chemistry:
/// equivalents, yields and the balance closure are ratios of masses.
/// </summary>
internal sealed class BatchTemplate
{
    private BatchTemplate(string recipe, string recipeVersion, string kind, string number, IReadOnlyList<ExportRow> rows)
    {
        Recipe = recipe;
        RecipeVersion = recipeVersion;
        Kind = kind;
        Number = number;
        Rows = rows;
    }

    public string Recipe { get; }
    public string RecipeVersion { get; }

    /// <summary>The short recipe tag of the batch ids (BZ, PZ, NB).</summary>
    public string Kind { get; }

    /// <summary>The template batch's own number, as it appears inside lot numbers (e.g. 0411 in ENB-0411-1).</summary>
    public string Number { get; }

    public IReadOnlyList<ExportRow> Rows { get; }

    /// <summary>Reads the one batch of a sample file; columns are found by name, as the program does.</summary>
    public static BatchTemplate Read(string path, string kind)
    {
        var lines = File.ReadAllLines(path).Where(l => l.Length > 0).ToList();
        var header = CsvLine.Split(lines[0]);
        int Col(string name) => header.IndexOf(name);
        string Field(IReadOnlyList<string> f, string name) => Col(name) is >= 0 and var i && i < f.Count ? f[i] : string.Empty;

        var rows = new List<ExportRow>();
        string batch = string.Empty, recipe = string.Empty, version = string.Empty;
        foreach (var line in lines.Skip(1))
        {
            var f = CsvLine.Split(line);
            batch = Field(f, "batch");
            recipe = Field(f, "recipe");
            version = Field(f, "recipe_version");
            rows.Add(new ExportRow(
                Field(f, "step"), Field(f, "entry"), Field(f, "material"), Field(f, "stream"),
                Field(f, "quantity"), Field(f, "unit"), Field(f, "assay_pct"), Field(f, "lot"),
                DateTimeOffset.Parse(Field(f, "recorded_at"), CultureInfo.InvariantCulture, DateTimeStyles.None)));
        }

        // The templates are one-batch files; a file without the version column means the newest, which is 1 for all three.
        return new BatchTemplate(recipe, version.Length > 0 ? version : "1", kind, batch[(batch.LastIndexOf('-') + 1)..], rows);
    }
}
