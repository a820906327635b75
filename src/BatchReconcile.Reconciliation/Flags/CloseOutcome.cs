namespace BatchReconcile.Reconciliation.Flags;

/// <summary>Why a flag was closed (text forms <c>explained</c>, <c>deviation</c>, <c>corrected</c>, <c>superseded</c>).</summary>
public enum CloseOutcome
{
    /// <summary>The finding has an explanation that needs no further action; the note gives it.</summary>
    Explained,

    /// <summary>A deviation was raised under the site's procedure; its reference is kept.</summary>
    Deviation,

    /// <summary>The data was wrong and has been corrected (a re-export normally follows).</summary>
    Corrected,

    /// <summary>Set by the program only: a later revision of the batch replaced the flag's revision.</summary>
    Superseded,
}
