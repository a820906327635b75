using BatchReconcile.Cli.Tests.Support;
using System.Text.Json;

namespace BatchReconcile.Browser.Tests.Support;

/// <summary>One flag as <c>flags list --json</c> prints it (the fields the tests use).</summary>
public sealed record DayFlag(long Id, string Batch, int Revision, string Step, string Code, string Severity, string Day, string Message)
{
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web);

    /// <summary>The flags the real program lists, optionally for one production day.</summary>
    public static async Task<IReadOnlyList<DayFlag>> ListAsync(string data, string? day = null, string? config = null)
    {
        List<string> args = ["flags", "list", "--json", "--data", data];
        if (day is not null)
        {
            args.AddRange(["--day", day]);
        }

        if (config is not null)
        {
            args.AddRange(["--config", config]);
        }

        var result = await ProgramRunner.RunExpectingAsync(0, [.. args]);
        return JsonSerializer.Deserialize<List<DayFlag>>(result.Stdout, Json)
            ?? throw new InvalidOperationException($"flags list printed no JSON list: {result.Stdout}");
    }
}
