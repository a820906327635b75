namespace BatchReconcile.Chemistry.Equations;

/// <summary>Why an equation could not be balanced.</summary>
public enum BalanceFailureKind
{
    /// <summary>The text is not an equation (see the parse error).</summary>
    InvalidEquation,

    /// <summary>The same composition is written twice (on one side or on both).</summary>
    RepeatedSpecies,

    /// <summary>An element occurs on one side of the arrow only.</summary>
    ElementOnOneSide,

    /// <summary>Only all-zero coefficients satisfy the element balances.</summary>
    NoSolution,

    /// <summary>The atoms could balance, but not together with the charge.</summary>
    ChargeCannotBalance,

    /// <summary>The atoms leave more than one free ratio: several independent reactions are mixed.</summary>
    MultipleIndependentReactions,

    /// <summary>The single solution needs a zero or negative coefficient (a species on the wrong side).</summary>
    NoPositiveSolution,
}
