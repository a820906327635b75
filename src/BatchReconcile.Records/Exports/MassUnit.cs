using System.Diagnostics.CodeAnalysis;

namespace BatchReconcile.Records.Exports;

/// <summary>A unit of mass the export may use, with its exact factor to kilograms.</summary>
public sealed record MassUnit(string Symbol, double KilogramsPerUnit)
{
    public static readonly MassUnit Kilogram = new("kg", 1.0);
    public static readonly MassUnit Gram = new("g", 1e-3);
    public static readonly MassUnit Milligram = new("mg", 1e-6);
    public static readonly MassUnit Tonne = new("t", 1e3);

    /// <summary>The avoirdupois pound, 0.45359237 kg exactly (international yard and pound agreement, 1959).</summary>
    public static readonly MassUnit Pound = new("lb", 0.45359237);

    public static IReadOnlyList<MassUnit> All { get; } = [Kilogram, Gram, Milligram, Tonne, Pound];

    public static bool TryParse(string? text, [NotNullWhen(true)] out MassUnit? unit)
    {
        var key = text?.Trim();
        unit = All.FirstOrDefault(u => string.Equals(u.Symbol, key, StringComparison.OrdinalIgnoreCase));
        return unit is not null;
    }

    public double ToKilograms(double quantity) => quantity * KilogramsPerUnit;
}
