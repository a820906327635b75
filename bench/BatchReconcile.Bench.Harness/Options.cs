using System.Globalization;

namespace BatchReconcile.Bench.Harness;

/// <summary>The harness's <c>--name value</c> and <c>--flag</c> options.</summary>
internal sealed class Options
{
    private readonly Dictionary<string, string?> _values = new(StringComparer.Ordinal);

    public static Options Parse(IEnumerable<string> args)
    {
        var options = new Options();
        var list = args.ToList();
        for (var i = 0; i < list.Count; i++)
        {
            if (!list[i].StartsWith("--", StringComparison.Ordinal))
            {
                throw new ArgumentException($"unexpected argument '{list[i]}'");
            }

            var name = list[i][2..];
            var hasValue = i + 1 < list.Count && !list[i + 1].StartsWith("--", StringComparison.Ordinal);
            options._values[name] = hasValue ? list[++i] : null;
        }

        return options;
    }

    /// <summary>Refuses any option not in <paramref name="known"/>, so that a mistyped or unsupported one does not start a 30-minute run.</summary>
    public void OnlyKnown(params string[] known)
    {
        var unknown = _values.Keys.Where(name => !known.Contains(name, StringComparer.Ordinal)).Order(StringComparer.Ordinal).ToList();
        if (unknown.Count > 0)
        {
            throw new ArgumentException($"unknown option(s): {string.Join(", ", unknown.Select(n => "--" + n))}; known: {string.Join(", ", known.Select(n => "--" + n))}");
        }
    }

    public bool Flag(string name) => _values.ContainsKey(name);

    public string? Text(string name) => _values.GetValueOrDefault(name);

    public int Int(string name, int fallback) =>
        Text(name) is { } text ? int.Parse(text, NumberStyles.Integer, CultureInfo.InvariantCulture) : fallback;

    public double Double(string name, double fallback) =>
        Text(name) is { } text ? double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture) : fallback;
}
