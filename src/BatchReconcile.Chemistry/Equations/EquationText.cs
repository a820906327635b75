using System.Diagnostics.CodeAnalysis;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// Splits equation text into sides and terms without interpreting the species, so the syntax
/// rules live in one place:
/// <list type="bullet">
/// <item>Exactly one arrow: "-&gt;", "→", "=", "&lt;=&gt;" or "⇌".</item>
/// <item>Terms are separated by a '+' with whitespace (or the end of the side) on both sides of it;
/// a '+' touching other characters belongs to a formula, as in "NH4^+" or "Fe^3+".</item>
/// <item>A term is an optional positive coefficient (integer "2", decimal "0.5" or fraction "1/2")
/// then the species. The coefficient may be separated by whitespace ("2 H2O") or glued on
/// ("2H2O", "1/2O2") when the species then starts with a letter, '(' or '['. A term that is itself
/// a known name (for example a material code that starts with a digit) is never split.</item>
/// </list>
/// </summary>
internal static class EquationText
{
    private static readonly string[] Arrows = ["<=>", "->", "→", "⇌", "="];

    internal const string ArrowList = "'->', '→', '=', '<=>' or '⇌'";

    public static bool TryTokenize(
        string text,
        Func<string, bool>? isKnownName,
        out IReadOnlyList<EquationTextTerm> terms,
        [NotNullWhen(false)] out EquationError? error)
    {
        ArgumentNullException.ThrowIfNull(text);
        terms = [];
        error = null;

        if (string.IsNullOrWhiteSpace(text))
        {
            error = new EquationError(1, $"empty equation: expected reactants, an arrow ({ArrowList}) and products");
            return false;
        }

        var arrows = FindArrows(text);
        if (arrows.Count == 0)
        {
            error = new EquationError(1, $"no arrow: expected one of {ArrowList} between reactants and products");
            return false;
        }

        if (arrows.Count > 1)
        {
            var (first, _) = arrows[0];
            var (second, _) = arrows[1];
            error = new EquationError(
                second + 1,
                $"two arrows: one at {first + 1} and another at {second + 1}; an equation has exactly one");
            return false;
        }

        var (arrowStart, arrowLength) = arrows[0];
        var result = new List<EquationTextTerm>();
        if (!TrySplitSide(text, 0, arrowStart, EquationSide.Reactants, arrowStart + 1, isKnownName, result, out error)
            || !TrySplitSide(text, arrowStart + arrowLength, text.Length, EquationSide.Products, arrowStart + 1, isKnownName, result, out error))
        {
            return false;
        }

        terms = result;
        return true;
    }

    internal static string SideName(EquationSide side) => side == EquationSide.Reactants ? "left" : "right";

    private static List<(int Start, int Length)> FindArrows(string text)
    {
        var found = new List<(int, int)>();
        var i = 0;
        while (i < text.Length)
        {
            var matched = 0;
            foreach (var arrow in Arrows)
            {
                if (string.CompareOrdinal(text, i, arrow, 0, arrow.Length) == 0)
                {
                    matched = arrow.Length;
                    break;
                }
            }

            if (matched > 0)
            {
                found.Add((i, matched));
                i += matched;
            }
            else
            {
                i++;
            }
        }

        return found;
    }

    private static bool TrySplitSide(
        string text,
        int start,
        int end,
        EquationSide side,
        int arrowPosition,
        Func<string, bool>? isKnownName,
        List<EquationTextTerm> terms,
        [NotNullWhen(false)] out EquationError? error)
    {
        error = null;
        var sideName = SideName(side);
        if (text.AsSpan(start, end - start).IsWhiteSpace())
        {
            error = new EquationError(
                side == EquationSide.Reactants ? arrowPosition : Math.Min(end + 1, text.Length + 1),
                $"empty side: nothing on the {sideName} of the arrow");
            return false;
        }

        var index = 0;
        var termStart = start;
        for (var i = start; i <= end; i++)
        {
            if (i < end && !IsSeparator(text, i, start, end))
            {
                continue;
            }

            index++;
            if (!TryReadTerm(text, termStart, i, side, index, isKnownName, out var term, out error))
            {
                return false;
            }

            terms.Add(term);
            termStart = i + 1;
        }

        return true;
    }

    // Whitespace on both sides is what tells "A + B" apart from the charge in "NH4^+ + OH^-".
    private static bool IsSeparator(string text, int i, int start, int end) =>
        text[i] == '+'
        && (i == start || char.IsWhiteSpace(text[i - 1]))
        && (i == end - 1 || char.IsWhiteSpace(text[i + 1]));

    private static bool TryReadTerm(
        string text,
        int start,
        int end,
        EquationSide side,
        int index,
        Func<string, bool>? isKnownName,
        [NotNullWhen(true)] out EquationTextTerm? term,
        [NotNullWhen(false)] out EquationError? error)
    {
        term = null;
        error = null;
        var where = $"species {index} on the {SideName(side)}";

        while (start < end && char.IsWhiteSpace(text[start]))
        {
            start++;
        }

        while (end > start && char.IsWhiteSpace(text[end - 1]))
        {
            end--;
        }

        if (start == end)
        {
            error = new EquationError(start + 1, $"{where} is empty: expected a species between the '+' signs");
            return false;
        }

        var raw = text[start..end];
        if (isKnownName is not null && isKnownName(raw))
        {
            term = new EquationTextTerm(side, index, start + 1, raw, null);
            return true;
        }

        var space = IndexOfWhiteSpace(raw);
        if (space >= 0)
        {
            var head = raw[..space];
            var speciesOffset = space;
            while (char.IsWhiteSpace(raw[speciesOffset]))
            {
                speciesOffset++;
            }

            var species = raw[speciesOffset..];
            if (!Rational.TryParse(head, out var coefficient))
            {
                error = new EquationError(
                    start + 1,
                    $"{where}: expected a coefficient (such as 2, 0.5 or 1/2) before '{species}', found '{head}'");
                return false;
            }

            if (IndexOfWhiteSpace(species) is var inner and >= 0)
            {
                error = new EquationError(
                    start + speciesOffset + inner + 1,
                    $"{where}: unexpected space inside '{species}'; separate species with ' + '");
                return false;
            }

            return TryFinishTerm(side, index, start + 1, start + speciesOffset + 1, species, coefficient, where, out term, out error);
        }

        if (raw[0] is (>= '0' and <= '9') or '.' or '-')
        {
            var length = 1;
            while (length < raw.Length && raw[length] is (>= '0' and <= '9') or '.' or '/')
            {
                length++;
            }

            var head = raw[..length];
            var species = raw[length..];
            if (species.Length == 0)
            {
                error = new EquationError(start + 1, $"{where}: coefficient '{head}' has no species after it");
                return false;
            }

            if (!Rational.TryParse(head, out var coefficient))
            {
                error = new EquationError(start + 1, $"{where}: '{head}' is not a coefficient (expected such as 2, 0.5 or 1/2)");
                return false;
            }

            if (!char.IsLetter(species[0]) && species[0] is not ('(' or '['))
            {
                error = new EquationError(
                    start + length + 1,
                    $"{where}: expected a species starting with a letter, '(' or '[' after the coefficient '{head}', found '{species[0]}'");
                return false;
            }

            return TryFinishTerm(side, index, start + 1, start + length + 1, species, coefficient, where, out term, out error);
        }

        term = new EquationTextTerm(side, index, start + 1, raw, null);
        return true;
    }

    private static bool TryFinishTerm(
        EquationSide side,
        int index,
        int termPosition,
        int speciesPosition,
        string species,
        Rational coefficient,
        string where,
        [NotNullWhen(true)] out EquationTextTerm? term,
        [NotNullWhen(false)] out EquationError? error)
    {
        term = null;
        error = null;
        if (coefficient.Sign <= 0)
        {
            error = new EquationError(termPosition, $"{where}: coefficient {coefficient} must be positive");
            return false;
        }

        term = new EquationTextTerm(side, index, speciesPosition, species, coefficient);
        return true;
    }

    private static int IndexOfWhiteSpace(string text)
    {
        for (var i = 0; i < text.Length; i++)
        {
            if (char.IsWhiteSpace(text[i]))
            {
                return i;
            }
        }

        return -1;
    }
}
