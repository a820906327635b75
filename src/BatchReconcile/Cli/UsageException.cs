namespace BatchReconcile.Cli;

/// <summary>
/// Bad input or usage detected by a command: printed as one line on stderr, exit code 2.
/// The message names the position, file or line at fault.
/// </summary>
public sealed class UsageException(string message) : Exception(message);
