using System.Diagnostics.CodeAnalysis;

namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// The outcome of loading process-definition files: a catalogue when every file was valid, otherwise
/// every error found (never only the first). Notes are kept either way, for the host to log.
/// </summary>
public sealed class ProcessDefinitionLoadResult
{
    private ProcessDefinitionLoadResult(
        ProcessCatalog? catalog,
        IReadOnlyList<DefinitionError> errors,
        IReadOnlyList<DefinitionNote> notes,
        IReadOnlyList<string> files)
    {
        Catalog = catalog;
        Errors = errors;
        Notes = notes;
        Files = files;
    }

    [MemberNotNullWhen(true, nameof(Catalog))]
    public bool IsSuccess => Catalog is not null;

    /// <summary>The loaded catalogue; null when any error was found (a partly valid set is never used).</summary>
    public ProcessCatalog? Catalog { get; }

    /// <summary>Every problem found, in file order; empty on success.</summary>
    public IReadOnlyList<DefinitionError> Errors { get; }

    public IReadOnlyList<DefinitionNote> Notes { get; }

    /// <summary>The files that were read, as they are named in errors and notes.</summary>
    public IReadOnlyList<string> Files { get; }

    internal static ProcessDefinitionLoadResult Success(ProcessCatalog catalog, IReadOnlyList<DefinitionNote> notes, IReadOnlyList<string> files) =>
        new(catalog, [], notes, files);

    internal static ProcessDefinitionLoadResult Failure(IReadOnlyList<DefinitionError> errors, IReadOnlyList<DefinitionNote> notes, IReadOnlyList<string> files)
    {
        if (errors.Count == 0)
        {
            throw new ArgumentException("A failed load needs at least one error.", nameof(errors));
        }

        return new(null, errors, notes, files);
    }

    public override string ToString() =>
        IsSuccess
            ? $"{Catalog.Recipes.Count()} recipes, {Catalog.Materials.Count} materials from {Files.Count} files"
            : string.Join(Environment.NewLine, Errors);
}
