namespace BatchReconcile.Cli;

/// <summary>Process exit codes that other tools rely on (docs/cli.md).</summary>
public static class ExitCodes
{
    public const int Success = 0;
    public const int UnexpectedFailure = 1;
    public const int BadInput = 2;
    public const int CompletedWithQuarantine = 3;
}
