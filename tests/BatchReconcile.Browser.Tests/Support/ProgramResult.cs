namespace BatchReconcile.Browser.Tests.Support;

/// <summary>The outcome of one run of the real program.</summary>
public sealed record ProgramResult(int ExitCode, string Stdout, string Stderr);
