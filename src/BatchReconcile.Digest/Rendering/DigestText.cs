using System.Globalization;
using BatchReconcile.Digest.Model;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Rendering;

/// <summary>Wording and number formats shared by the HTML and Markdown digests (always the invariant culture).</summary>
public static class DigestText
{
    public const string Title = "Daily exception digest";

    public const string ProvisionalTitle = "Provisional daily exception digest";

    /// <summary>The digest's title: provisional when asked for before the day ended.</summary>
    public static string TitleOf(DigestData data) => data.Provisional ? ProvisionalTitle : Title;

    /// <summary>
    /// "Issue 2: replaces issue 1 written 2026-11-25 07:30 UTC+01:00 (kept as digest-2026-11-24-site.1.html). Why: 2 batches
    /// arrived since." Null for a first issue.
    /// </summary>
    public static string? ReissueSentence(DigestData data, string keptName)
    {
        ArgumentNullException.ThrowIfNull(data);
        return data.Reissue is not { } issue
            ? null
            : $"Issue {Count(issue.Number)}: replaces issue {Count(issue.Replaces)} written {Moment(issue.PreviousWrittenAt)} (kept as {keptName}). Why: {issue.Reason}.";
    }

    /// <summary>What a provisional digest says under its title; null for the day's digest.</summary>
    public static string? ProvisionalSentence(DigestData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        return data.Provisional
            ? $"Provisional: written {Moment(data.GeneratedAt)}, before the production day ended ({Moment(data.Day.End)}). "
                + "It is not the day's digest: batches and review decisions may still come, and the day's digest is written when it falls due."
            : null;
    }

    /// <summary>The cautions closing every digest.</summary>
    public static IReadOnlyList<string> Cautions { get; } =
    [
        "These figures support the site's deviation procedure and the judgement of a qualified reviewer; they do not replace either. A flag asks for a look, it is not a finding.",
        "Reactive steps, vented gases and solvents are handled under the site's process-safety practice and local codes. The vented masses shown are estimates of where mass went, not measurements of a release.",
        "A figure that could not be computed is shown as \"n/a\", never estimated.",
    ];

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static string Date(DateOnly day) => day.ToString("yyyy-MM-dd", Inv);

    public static string Moment(DateTimeOffset at) => at.ToString("yyyy-MM-dd HH:mm 'UTC'zzz", Inv);

    public static string Hours(TimeSpan length) => length.TotalHours.ToString("0.##", Inv) + " h";

    /// <summary>"2026-03-29 06:00 UTC+01:00 to 2026-03-30 06:00 UTC+02:00 (23 h, Europe/Berlin)".</summary>
    public static string DayBounds(DigestDay day) =>
        $"{Moment(day.Start)} to {Moment(day.End)} ({Hours(day.Length)}, {day.TimeZoneId})";

    /// <summary>Decimals for kg figures of one step: 0.01 kg for small charges, 0.1 kg from 100 kg up.</summary>
    public static int KgDecimals(double scaleKg) => Math.Abs(scaleKg) >= 100 ? 1 : 2;

    public static string Kg(double kg, int decimals) => Fixed(kg, decimals);

    public static string Pct(double pct) => Fixed(pct, 1);

    public static string Pct(double? pct) => pct is { } p ? Pct(p) : "n/a";

    public static string Number(double value, int decimals) => Fixed(value, decimals);

    /// <summary>What a step with a reactant not charged shows instead of its yield-based figures.</summary>
    public const string NotComputable =
        "yield, theoretical, SF, RME, PMI and E-factors are not computable (a reactant of the equation was not charged)";

    /// <summary>"65.9 %", or "n/a (step S2 has no rows)".</summary>
    public static string RouteYield(BatchRouteYield route) =>
        route.YieldPct is { } y ? Pct(y) + " %" : $"n/a ({route.Reason ?? "not computable"})";

    /// <summary>A flag's value with its unit: % and kg as the digest rounds them, equivalents to 0.01.</summary>
    public static string WithUnit(double? value, string unit) => value switch
    {
        null => "n/a",
        { } v when unit == "%" => Fixed(v, ValueDecimals(v, unit)) + " %",
        { } v when unit.Length == 0 => Fixed(v, ValueDecimals(v, unit)),
        { } v => Fixed(v, ValueDecimals(v, unit)) + " " + unit,
    };

    /// <summary>Decimals a flag's value is shown with: 0.1 for %, <see cref="KgDecimals"/> for kg, 0.01 otherwise.</summary>
    public static int ValueDecimals(double value, string unit) => unit switch
    {
        "%" => 1,
        "kg" => KgDecimals(value),
        _ => 2,
    };

    /// <summary>
    /// A flag's value rounded as the page shows it, as a number (the CSV writes it in its shortest form, so 76.54999999999995 %
    /// becomes 76.5, and 90.0 becomes 90). Half away from zero, and never -0.
    /// </summary>
    public static double? Rounded(double? value, string unit) => value is { } v ? RoundShown(v, ValueDecimals(v, unit)) : null;

    /// <summary>"87.2 % against 90.0 %", or the one that is known.</summary>
    public static string MeasuredAgainstLimit(DigestException e) => (e.Measured, e.Limit) switch
    {
        (null, null) => "n/a",
        (_, null) => WithUnit(e.Measured, e.Unit),
        (null, _) => "limit " + WithUnit(e.Limit, e.Unit),
        _ => $"{WithUnit(e.Measured, e.Unit)} against {WithUnit(e.Limit, e.Unit)}",
    };

    /// <summary>The flag code, with what it is about when the step has several (a reagent, a reactant).</summary>
    public static string FlagName(FlagCode code, string? subject) =>
        subject is null ? code.ToText() : $"{code.ToText()} ({subject})";

    public static string Severity(FlagSeverity severity) => severity.ToText();

    /// <summary>"Yield trend: 3rd of the last 5 batches below the centre line (centre 92.3 %, from the first 20 of the last 30 batches)."</summary>
    public static string? TrendSentence(TrendNote trend)
    {
        ArgumentNullException.ThrowIfNull(trend);
        return trend.Context is not { } context
            ? null
            : $"Yield trend: {context} (centre {Pct(trend.Centre)} %, from the first {Count(trend.BaselineCount)} of the last {Count(trend.HistoryCount)} batches).";
    }

    /// <summary>
    /// The run rules a yield breaks, as information: "Information, not a flag: this yield is within the master-record limits
    /// but breaks rule-2 of its recent trend (Nine points in a row on the same side of the centre line)." Null when none.
    /// </summary>
    public static string? SignalSentence(IReadOnlyList<RuleSignal> signals, bool withinLimits)
    {
        ArgumentNullException.ThrowIfNull(signals);
        if (signals.Count == 0)
        {
            return null;
        }

        var rules = string.Join("; ", signals.Select(s => $"{s.Code} ({s.Description.TrimEnd('.')})"));
        return withinLimits
            ? $"Information, not a flag: this yield is within the master-record limits but breaks a run rule of its recent trend: {rules}."
            : $"Information: this yield also breaks a run rule of its recent trend: {rules}.";
    }

    /// <summary>Whether a yield is within its limits (inclusive, 1e-9 relative as the flag rules); true when a limit is unknown.</summary>
    public static bool WithinLimits(double? value, double? min, double? max) => value switch
    {
        null => true,
        { } v when min is { } lo && v < lo - (1e-9 * Math.Max(1, Math.Abs(lo))) => false,
        { } v when max is { } hi && v > hi + (1e-9 * Math.Max(1, Math.Abs(hi))) => false,
        _ => true,
    };

    public static string AgeDays(int days) => days == 1 ? "1 day" : days.ToString(Inv) + " days";

    public static string Count(int n) => n.ToString(Inv);

    // Rounds first so that -0.004 prints as 0.00, not -0.00.
    private static string Fixed(double value, int decimals) =>
        RoundShown(value, decimals).ToString("F" + decimals.ToString(Inv), Inv);

    private static double RoundShown(double value, int decimals)
    {
        var rounded = Math.Round(value, decimals, MidpointRounding.AwayFromZero);
        return rounded == 0 ? 0 : rounded;
    }
}
