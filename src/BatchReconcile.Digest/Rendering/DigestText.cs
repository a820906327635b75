using System.Globalization;
using BatchReconcile.Digest.Model;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Rendering;

/// <summary>Wording and number formats shared by the HTML and Markdown digests (always the invariant culture).</summary>
public static class DigestText
{
    public const string Title = "Daily exception digest";

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
        { } v when unit == "%" => Pct(v) + " %",
        { } v when unit == "kg" => Kg(v, KgDecimals(v)) + " kg",
        { } v when unit == "equiv" => Fixed(v, 2) + " equiv",
        { } v when unit.Length == 0 => Fixed(v, 2),
        { } v => Fixed(v, 2) + " " + unit,
    };

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

    public static string AgeDays(int days) => days == 1 ? "1 day" : days.ToString(Inv) + " days";

    public static string Count(int n) => n.ToString(Inv);

    // Rounds first so that -0.004 prints as 0.00, not -0.00.
    private static string Fixed(double value, int decimals)
    {
        var rounded = Math.Round(value, decimals, MidpointRounding.AwayFromZero);
        if (rounded == 0)
        {
            rounded = 0;
        }

        return rounded.ToString("F" + decimals.ToString(Inv), Inv);
    }
}
