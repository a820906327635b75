namespace BatchReconcile.Chemistry.Formulas;

/// <summary>What went wrong while reading; turned into a message only when someone asks, so the mass path never allocates.</summary>
internal enum FormulaProblem
{
    None,
    Empty,
    TooLong,
    UnknownElement,
    NoStandardWeight,
    ExpectedSymbol,
    NeverClosed,
    NoMatchingOpen,
    MismatchedBracket,
    EmptyBrackets,
    TooDeep,
    ZeroNumber,
    TooManyDigits,
    NumberTooLarge,
    TooManyDecimals,
    TotalTooLarge,
    TotalTooSmall,
    NothingAfterSeparator,
    ExpectedCharge,
    ChargeSignMissing,
    ChargeZero,
    ChargeTooManyDigits,
    ChargeNotLast,
}
