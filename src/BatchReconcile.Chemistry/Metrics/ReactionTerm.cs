namespace BatchReconcile.Chemistry.Metrics;

/// <summary>One species of a balanced equation as the metrics need it: code, coefficient, molar mass.</summary>
/// <remarks>
/// The coefficient is a double because metrics are floating-point bookkeeping on weighed masses;
/// exact balancing happens elsewhere and hands its (rational) coefficients over converted.
/// </remarks>
public sealed record ReactionTerm
{
    private ReactionTerm(string code, double coefficient, double molarMassGPerMol)
    {
        Code = code;
        Coefficient = coefficient;
        MolarMassGPerMol = molarMassGPerMol;
    }

    /// <summary>Material code as used in the charge and output rows.</summary>
    public string Code { get; }

    /// <summary>Stoichiometric coefficient ν (&gt; 0).</summary>
    public double Coefficient { get; }

    /// <summary>Molar mass in g/mol, which is also kg/kmol.</summary>
    public double MolarMassGPerMol { get; }

    /// <summary>ν·M in g/mol: the mass this term contributes per mole of reaction extent.</summary>
    public double MassPerExtent => Coefficient * MolarMassGPerMol;

    /// <exception cref="ArgumentException">Empty code, or a coefficient or molar mass that is not finite and positive.</exception>
    public static ReactionTerm Create(string code, double coefficient, double molarMassGPerMol)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(code);
        Guard.FinitePositive(coefficient, nameof(coefficient), code);
        Guard.FinitePositive(molarMassGPerMol, nameof(molarMassGPerMol), code);
        return new ReactionTerm(code, coefficient, molarMassGPerMol);
    }
}
