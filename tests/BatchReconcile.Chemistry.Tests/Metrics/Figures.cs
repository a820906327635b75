using System.Reflection;
using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>Reads a named figure from a result so hand-worked cases can be written as tables.</summary>
internal static class Figures
{
    /// <summary>"YieldPct", "Balance.GapKg", "Rung:ExcessReactants", "Reactant:H2.Equivalents".</summary>
    public static double? Get(StepResult result, string path)
    {
        if (path.StartsWith("Rung:", StringComparison.Ordinal))
        {
            var kind = Enum.Parse<LossRungKind>(path["Rung:".Length..]);
            return result.Ladder?[kind].Kg;
        }

        object? target = result;
        string rest = path;
        if (path.StartsWith("Reactant:", StringComparison.Ordinal) || path.StartsWith("Reagent:", StringComparison.Ordinal))
        {
            int colon = path.IndexOf(':', StringComparison.Ordinal);
            int dot = path.IndexOf('.', StringComparison.Ordinal);
            string code = path[(colon + 1)..dot];
            var list = path.StartsWith("Reactant:", StringComparison.Ordinal) ? result.Reactants : result.Reagents;
            target = list.Single(a => a.Material == code);
            rest = path[(dot + 1)..];
        }

        foreach (string name in rest.Split('.'))
        {
            var property = target!.GetType().GetProperty(name, BindingFlags.Public | BindingFlags.Instance)
                ?? throw new ArgumentException($"No figure '{name}' in '{path}'.");
            target = property.GetValue(target);
        }

        return target switch
        {
            null => null,
            double d => d,
            _ => throw new ArgumentException($"Figure '{path}' is not a number."),
        };
    }

    /// <summary>Every double (and double?) the result exposes, with its path, for "never NaN or infinity" checks.</summary>
    public static IEnumerable<(string Path, double Value)> AllNumbers(StepResult result)
    {
        foreach (var item in Numbers(result, nameof(StepResult)))
        {
            yield return item;
        }

        foreach (var amount in result.Reactants.Concat(result.Reagents))
        {
            foreach (var item in Numbers(amount, amount.Material))
            {
                yield return item;
            }
        }

        foreach (var item in Numbers(result.Balance, nameof(MassBalance)))
        {
            yield return item;
        }

        foreach (var rung in result.Ladder?.Rungs ?? [])
        {
            foreach (var item in Numbers(rung, rung.Kind.ToString()))
            {
                yield return item;
            }
        }
    }

    private static IEnumerable<(string, double)> Numbers(object target, string prefix)
    {
        foreach (var p in target.GetType().GetProperties(BindingFlags.Public | BindingFlags.Instance))
        {
            if (p.GetIndexParameters().Length == 0 && p.GetValue(target) is double d)
            {
                yield return ($"{prefix}.{p.Name}", d);
            }
        }
    }
}
