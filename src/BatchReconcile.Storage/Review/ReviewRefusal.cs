namespace BatchReconcile.Storage.Review;

/// <summary>Why a review change was refused (the reason text says it for people).</summary>
public enum ReviewRefusal
{
    UnknownFlag,
    FlagSuperseded,
    SameState,
    TransitionNotAllowed,
    OutcomeMissing,
    OutcomeNotAllowed,
    DeviationRefMissing,
    DeviationRefNotAllowed,
    NoteMissing,
    ReviewerMissing,
    BadText,
}
