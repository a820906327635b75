namespace BatchReconcile.Digest.Model;

/// <summary>Why a flag was closed (text forms: explained, deviation, corrected, superseded).</summary>
public enum CloseOutcome
{
    Explained,
    Deviation,
    Corrected,

    /// <summary>Set by the system only, when a newer revision of the batch supersedes the flag's revision.</summary>
    Superseded,
}
