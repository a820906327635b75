namespace BatchReconcile.Chemistry.Metrics;

/// <summary>One `charge` row of a step: mass put into the vessel, in kg.</summary>
/// <remarks>
/// Whether a row is a reactant is decided by its material code matching a reactant of the equation,
/// not by <see cref="Role"/>; the role only matters for charges outside the equation.
/// </remarks>
public sealed record ChargeRow
{
    private ChargeRow(string material, double grossKg, double assayPct, AuxiliaryRole role, IReadOnlyList<ChargeContent> contents)
    {
        Material = material;
        GrossKg = grossKg;
        AssayPct = assayPct;
        Role = role;
        Contents = contents;
    }

    public string Material { get; }

    /// <summary>Gross (as weighed) mass in kg.</summary>
    public double GrossKg { get; }

    /// <summary>Mass % of the named material in the gross mass, in (0, 100].</summary>
    public double AssayPct { get; }

    public AuxiliaryRole Role { get; }

    /// <summary>m·a/100: mass of the named material itself, in kg (for a solution, of its first component).</summary>
    public double AssayKg => GrossKg * AssayPct / 100;

    /// <summary>What the row supplies, material by material: its own material at <see cref="AssayKg"/>, or a solution's components.</summary>
    public IReadOnlyList<ChargeContent> Contents { get; }

    /// <summary>True when the row is a solution whose components are counted one by one.</summary>
    public bool IsSolution => Contents.Count != 1 || Contents[0].Material != Material;

    /// <exception cref="ArgumentException">Empty material, negative or non-finite mass, assay outside (0, 100].</exception>
    public static ChargeRow Create(string material, double grossKg, double assayPct = 100, AuxiliaryRole role = AuxiliaryRole.Other)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(material);
        Guard.FiniteNonNegative(grossKg, nameof(grossKg), material);
        Guard.AssayPct(assayPct, nameof(assayPct), material);
        return new ChargeRow(material, grossKg, assayPct, role, [new ChargeContent(material, grossKg * assayPct / 100, role)]);
    }

    /// <summary>A charge of a solution: <paramref name="grossKg"/> as weighed, supplying each of <paramref name="contents"/>.</summary>
    /// <param name="material">The solution's own code (it is never a species of the equation).</param>
    /// <param name="contents">Components and their masses; together at most the gross mass (1e-9 relative allowed for rounding).</param>
    /// <exception cref="ArgumentException">Empty codes, a negative or non-finite mass, a component named twice or the
    /// solution itself, or components heavier than the row.</exception>
    public static ChargeRow Solution(string material, double grossKg, IEnumerable<ChargeContent> contents)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(material);
        ArgumentNullException.ThrowIfNull(contents);
        Guard.FiniteNonNegative(grossKg, nameof(grossKg), material);
        var list = contents.ToArray();
        if (list.Length == 0)
        {
            throw new ArgumentException($"{material}: a solution charge needs at least one component.", nameof(contents));
        }

        var seen = new HashSet<string>(StringComparer.Ordinal) { material };
        foreach (var content in list)
        {
            ArgumentNullException.ThrowIfNull(content);
            ArgumentException.ThrowIfNullOrWhiteSpace(content.Material);
            Guard.FiniteNonNegative(content.Kg, nameof(contents), content.Material);
            if (!seen.Add(content.Material))
            {
                throw new ArgumentException($"{material}: component '{content.Material}' is named twice or is the solution itself.", nameof(contents));
            }
        }

        double sum = list.Sum(c => c.Kg);
        if (sum > grossKg * (1 + 1e-9))
        {
            throw new ArgumentException(
                string.Create(System.Globalization.CultureInfo.InvariantCulture, $"{material}: components of {sum} kg exceed the row's {grossKg} kg."),
                nameof(contents));
        }

        double firstPct = grossKg > 0 ? Math.Clamp(100 * list[0].Kg / grossKg, double.Epsilon, 100) : 100;
        return new ChargeRow(material, grossKg, firstPct, AuxiliaryRole.Other, list);
    }
}
