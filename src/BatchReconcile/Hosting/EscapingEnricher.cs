using BatchReconcile.Records;
using Serilog.Core;
using Serilog.Events;

namespace BatchReconcile.Hosting;

/// <summary>
/// Escapes control and bidirectional-control characters (<see cref="SafeText"/>) in every string
/// property of every log event, so that a value from a file (a file name, a batch id, a value quoted in an
/// error) cannot forge a log line, move a terminal's cursor or reverse the text after it. Runs before
/// any sink renders the event; the message templates are the program's own text. Exception messages
/// and stack traces are not rewritten.
/// </summary>
public sealed class EscapingEnricher : ILogEventEnricher
{
    public void Enrich(LogEvent logEvent, ILogEventPropertyFactory propertyFactory)
    {
        ArgumentNullException.ThrowIfNull(logEvent);
        List<LogEventProperty>? changed = null;
        foreach (var (name, value) in logEvent.Properties)
        {
            if (value is ScalarValue { Value: string text } && SafeText.IndexOfRefused(text) >= 0)
            {
                (changed ??= []).Add(new LogEventProperty(name, new ScalarValue(SafeText.Escape(text))));
            }
        }

        foreach (var property in changed ?? [])
        {
            logEvent.AddOrUpdateProperty(property);
        }
    }
}
