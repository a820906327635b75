namespace BatchReconcile.Hosting;

/// <summary>The settings cannot be used; the message names the file and the setting.</summary>
public sealed class ConfigurationException(string message) : Exception(message);
