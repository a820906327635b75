using BatchReconcile.Hosting;
using Serilog;
using Serilog.Core;
using Serilog.Events;

namespace BatchReconcile.Tests.Hosting;

/// <summary>Log lines carry values from files escaped: a batch id or file name cannot forge a line or drive the terminal.</summary>
public class EscapingEnricherTests
{
    [Theory]
    [InlineData("B1\r\n12:00:00 INF forged line", "B1\\x0D\\x0A12:00:00 INF forged line")]
    [InlineData("\u001B[2J\u001B]0;title\u0007", "\\x1B[2J\\x1B]0;title\\x07")]
    [InlineData("\u202Evsc.exe", "\\u202Evsc.exe")]
    [InlineData("KB3-PZ-0233", "KB3-PZ-0233")]
    public void String_properties_are_escaped_before_any_sink_renders_them(string value, string rendered)
    {
        var sink = new Collect();
        using (var logger = new LoggerConfiguration().Enrich.With<EscapingEnricher>().WriteTo.Sink(sink).CreateLogger())
        {
            logger.Information("{File} batch {Batch} count {Count}", "x.csv", value, 3);
        }

        var message = Assert.Single(sink.Messages);
        Assert.Equal($"\"x.csv\" batch \"{rendered}\" count 3", message);
    }

    private sealed class Collect : ILogEventSink
    {
        public List<string> Messages { get; } = [];

        public void Emit(LogEvent logEvent) => Messages.Add(logEvent.RenderMessage(System.Globalization.CultureInfo.InvariantCulture));
    }
}
