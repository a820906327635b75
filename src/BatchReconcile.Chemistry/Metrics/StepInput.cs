using System.Globalization;

namespace BatchReconcile.Chemistry.Metrics;

/// <summary>Everything one step's metrics are computed from: the equation, the weighed rows and the balance settings.</summary>
public sealed record StepInput
{
    private StepInput(
        StepReaction reaction,
        IReadOnlyList<ChargeRow> charges,
        IReadOnlyList<OutputRow> outputs,
        BalanceCheckSettings balance,
        IReadOnlyDictionary<string, double> reagentMolarMasses)
    {
        Reaction = reaction;
        Charges = charges;
        Outputs = outputs;
        Balance = balance;
        ReagentMolarMasses = reagentMolarMasses;
    }

    public StepReaction Reaction { get; }

    public IReadOnlyList<ChargeRow> Charges { get; }

    public IReadOnlyList<OutputRow> Outputs { get; }

    public BalanceCheckSettings Balance { get; }

    /// <summary>Molar masses (g/mol) of charged materials outside the equation whose equivalents are wanted (a base, a catalyst).</summary>
    public IReadOnlyDictionary<string, double> ReagentMolarMasses { get; }

    /// <exception cref="ArgumentException">A reagent molar mass that is not positive, or given for a species of the equation; a solution charge whose own code is a species.</exception>
    public static StepInput Create(
        StepReaction reaction,
        IEnumerable<ChargeRow> charges,
        IEnumerable<OutputRow> outputs,
        BalanceCheckSettings balance,
        IReadOnlyDictionary<string, double>? reagentMolarMasses = null)
    {
        ArgumentNullException.ThrowIfNull(reaction);
        ArgumentNullException.ThrowIfNull(charges);
        ArgumentNullException.ThrowIfNull(outputs);
        ArgumentNullException.ThrowIfNull(balance);
        var chargeList = charges.ToArray();
        var outputList = outputs.ToArray();
        if (chargeList.Any(c => c is null) || outputList.Any(o => o is null))
        {
            throw new ArgumentException("Rows must not be null.", nameof(charges));
        }

        var solutionInEquation = chargeList.FirstOrDefault(c =>
            c.IsSolution && (reaction.Reactants.Any(r => r.Code == c.Material) || reaction.Product.Code == c.Material));
        if (solutionInEquation is not null)
        {
            throw new ArgumentException(
                $"'{solutionInEquation.Material}' is charged as a solution; the equation names its components, not the solution.",
                nameof(charges));
        }

        var reagents = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var (code, molarMass) in reagentMolarMasses ?? new Dictionary<string, double>())
        {
            Guard.FinitePositive(molarMass, nameof(reagentMolarMasses), code);
            if (reaction.Reactants.Any(r => r.Code == code) || reaction.Product.Code == code)
            {
                throw new ArgumentException(
                    string.Create(CultureInfo.InvariantCulture, $"'{code}' is a species of the equation; its molar mass comes from there."),
                    nameof(reagentMolarMasses));
            }

            reagents.Add(code, molarMass);
        }

        return new StepInput(reaction, chargeList, outputList, balance, reagents);
    }
}
