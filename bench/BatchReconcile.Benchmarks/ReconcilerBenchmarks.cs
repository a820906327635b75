using BatchReconcile.Reconciliation;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Definitions.Loading;
using BatchReconcile.Records.Exports;
using BatchReconcile.Records.Exports.Reading;
using BenchmarkDotNet.Attributes;

namespace BatchReconcile.Benchmarks;

/// <summary>
/// Reconciling one stored-ready batch (already read and validated) against its recipe, with the site's
/// default settings: the two-step BZC-410 batch (29 rows), the PPZ-220 batch with vented gases (11 rows)
/// and the NBB-150 batch with solvent recovery (23 rows) of the demo plant. Reading the CSV is not included.
/// </summary>
[MemoryDiagnoser]
[MedianColumn]
public class ReconcilerBenchmarks
{
    private ProcessCatalog _catalog = null!;
    private ReconciliationSettings _settings = null!;
    private readonly Dictionary<string, (BatchRecord Batch, Recipe Recipe)> _batches = new(StringComparer.Ordinal);

    [Params("BZC-410 two steps", "PPZ-220 vents", "NBB-150 solvent recovery")]
    public string Batch { get; set; } = string.Empty;

    [GlobalSetup]
    public void Setup()
    {
        var repo = FindRepo();
        var loaded = ProcessDefinitionLoader.LoadFolder(Path.Combine(repo, "config", "processes"));
        if (!loaded.IsSuccess)
        {
            throw new InvalidOperationException("the sample process definitions do not load: " + loaded);
        }

        _catalog = loaded.Catalog;
        _settings = new ReconciliationSettings();
        var inbox = Path.Combine(repo, "sample-data", "inbox");
        Add("BZC-410 two steps", Path.Combine(inbox, "2026-11-23T2135_KB3-BZ-0411.csv"));
        Add("PPZ-220 vents", Path.Combine(inbox, "2026-11-23T1012_KB3-PZ-0227.csv"));
        Add("NBB-150 solvent recovery", Path.Combine(inbox, "2026-11-23T1705_KB3-NB-0158.csv"));
    }

    [Benchmark]
    public BatchOutcome Reconcile()
    {
        var (batch, recipe) = _batches[Batch];
        return BatchReconciler.Reconcile(batch, recipe, _catalog, _settings);
    }

    private void Add(string label, string path)
    {
        var read = ExportReader.Read(path, Path.GetFileName(path), _catalog, TimeZoneInfo.Utc);
        if (!read.IsValid)
        {
            throw new InvalidOperationException($"{path} does not read: {read.Errors[0].Reason}");
        }

        var batch = read.Batches[0];
        _batches[label] = (batch, _catalog.FindRecipe(batch.RecipeCode, batch.RecipeVersion)!);
    }

    private static string FindRepo()
    {
        // BenchmarkDotNet runs the benchmarks from a generated project below the artifacts folder.
        foreach (var start in new[] { Environment.CurrentDirectory, AppContext.BaseDirectory })
        {
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                if (File.Exists(Path.Combine(dir.FullName, "BatchReconcile.sln")))
                {
                    return dir.FullName;
                }
            }
        }

        throw new InvalidOperationException("BatchReconcile.sln not found above the working folder");
    }
}
