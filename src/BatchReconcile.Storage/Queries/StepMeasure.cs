using System.Diagnostics.CodeAnalysis;

namespace BatchReconcile.Storage.Queries;

/// <summary>What a <see cref="StepMeasure"/> reads from a stored step.</summary>
public enum StepMeasureKind
{
    Yield,
    Closure,
    Rme,
    Pmi,
    CompleteEFactor,
    SimpleEFactor,
    Gap,
    Equivalents,
}

/// <summary>
/// One stored figure of a step, followed batch by batch (<c>BatchStore.StepSeries</c>, <c>trend --measure</c>):
/// yield (the default), closure, RME, PMI, complete or simple E-factor, gap, or the equivalents of one material.
/// As text: <c>yield</c>, <c>closure</c>, <c>rme</c>, <c>pmi</c>, <c>complete-e-factor</c>, <c>simple-e-factor</c>,
/// <c>gap</c>, <c>equivalents:CODE</c>.
/// </summary>
public sealed record StepMeasure
{
    private static readonly (string Text, StepMeasureKind Kind)[] Plain =
    [
        ("yield", StepMeasureKind.Yield),
        ("closure", StepMeasureKind.Closure),
        ("rme", StepMeasureKind.Rme),
        ("pmi", StepMeasureKind.Pmi),
        ("complete-e-factor", StepMeasureKind.CompleteEFactor),
        ("simple-e-factor", StepMeasureKind.SimpleEFactor),
        ("gap", StepMeasureKind.Gap),
    ];

    private const string EquivalentsPrefix = "equivalents:";

    private StepMeasure(StepMeasureKind kind, string? material)
    {
        Kind = kind;
        Material = material;
    }

    public StepMeasureKind Kind { get; }

    /// <summary>The material code of <see cref="StepMeasureKind.Equivalents"/>; null otherwise.</summary>
    public string? Material { get; }

    public static StepMeasure Yield { get; } = new(StepMeasureKind.Yield, null);

    public static StepMeasure Closure { get; } = new(StepMeasureKind.Closure, null);

    public static StepMeasure Rme { get; } = new(StepMeasureKind.Rme, null);

    public static StepMeasure Pmi { get; } = new(StepMeasureKind.Pmi, null);

    public static StepMeasure CompleteEFactor { get; } = new(StepMeasureKind.CompleteEFactor, null);

    public static StepMeasure SimpleEFactor { get; } = new(StepMeasureKind.SimpleEFactor, null);

    public static StepMeasure Gap { get; } = new(StepMeasureKind.Gap, null);

    /// <summary>The names a measure is written as, for help and error messages.</summary>
    public static IReadOnlyList<string> Names { get; } = [.. Plain.Select(p => p.Text), EquivalentsPrefix + "CODE"];

    /// <summary>Equivalents of one material (moles charged per mole of the limiting reactant, as stored).</summary>
    public static StepMeasure Equivalents(string material)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(material);
        return new StepMeasure(StepMeasureKind.Equivalents, material.Trim());
    }

    /// <summary>Reads a measure from its text (names without regard to case; the material code as written, trimmed).</summary>
    public static bool TryParse(string? text, [NotNullWhen(true)] out StepMeasure? measure)
    {
        measure = null;
        var t = text?.Trim();
        if (string.IsNullOrEmpty(t))
        {
            return false;
        }

        if (t.StartsWith(EquivalentsPrefix, StringComparison.OrdinalIgnoreCase))
        {
            var material = t[EquivalentsPrefix.Length..].Trim();
            if (material.Length == 0)
            {
                return false;
            }

            measure = Equivalents(material);
            return true;
        }

        foreach (var (name, kind) in Plain)
        {
            if (string.Equals(name, t, StringComparison.OrdinalIgnoreCase))
            {
                measure = From(kind);
                return true;
            }
        }

        return false;
    }

    /// <summary>The measure as text, e.g. <c>yield</c> or <c>equivalents:ETOH</c>.</summary>
    public string ToText() => Kind == StepMeasureKind.Equivalents
        ? EquivalentsPrefix + Material
        : Plain.First(p => p.Kind == Kind).Text;

    /// <summary>The unit of the figure: <c>%</c>, <c>kg</c>, <c>kg/kg</c> (PMI, E-factors) or <c>eq</c>.</summary>
    public string Unit => Kind switch
    {
        StepMeasureKind.Yield or StepMeasureKind.Closure or StepMeasureKind.Rme => "%",
        StepMeasureKind.Gap => "kg",
        StepMeasureKind.Equivalents => "eq",
        _ => "kg/kg",
    };

    public override string ToString() => ToText();

    /// <summary>The step_result column the figure is read from (a fixed name, never input).</summary>
    internal string Column => Kind switch
    {
        StepMeasureKind.Yield => "s.yield_pct",
        StepMeasureKind.Closure => "s.closure_pct",
        StepMeasureKind.Rme => "s.rme_pct",
        StepMeasureKind.Pmi => "s.pmi",
        StepMeasureKind.CompleteEFactor => "s.complete_e_factor",
        StepMeasureKind.SimpleEFactor => "s.simple_e_factor",
        StepMeasureKind.Gap => "s.gap_kg",
        StepMeasureKind.Equivalents => "s.equivalents",
        _ => throw new InvalidOperationException($"No column for {Kind}."),
    };

    private static StepMeasure From(StepMeasureKind kind) => kind switch
    {
        StepMeasureKind.Yield => Yield,
        StepMeasureKind.Closure => Closure,
        StepMeasureKind.Rme => Rme,
        StepMeasureKind.Pmi => Pmi,
        StepMeasureKind.CompleteEFactor => CompleteEFactor,
        StepMeasureKind.SimpleEFactor => SimpleEFactor,
        StepMeasureKind.Gap => Gap,
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "equivalents need a material"),
    };
}
