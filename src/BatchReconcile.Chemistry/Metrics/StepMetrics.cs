namespace BatchReconcile.Chemistry.Metrics;

/// <summary>Computes the green-chemistry and reconciliation metrics of one step from plain inputs.</summary>
/// <remarks>
/// <para>Simple E-factor. Roschangar, Sheldon and Senanayake (Green Chem. 2015) define sEF as ignoring
/// solvents and water entirely. Here it is the complete E-factor with the net solvent and water taken out:
/// sEF = (m_in − m_sw,in − (m_rec − m_sw,rec) − m_act)/m_act, where m_sw,in is the gross mass of charges
/// outside the equation whose role is solvent or water and m_sw,rec the recovered rows with that role. So
/// cEF − sEF = (m_sw,in − m_sw,rec)/m_act, and recovery of anything else (excess reagent) is credited in both,
/// as the spec's cEF credits it. A reactant is never treated as solvent, even when it also serves as one
/// (ethanol in an esterification): it is a raw material of the equation. A charge of a solution material
/// (<see cref="ChargeRow.Solution"/>) counts its solvent and water components as solvent and water; the
/// diluent of a plain row with an assay below 100 % stays in sEF because it is not identified (conservative).</para>
/// <para>With a reactant of the equation not charged (<see cref="StepResult.MissingReactants"/>), the yield and
/// every figure that sets the product against the charged mass (SF, RME, RME_g, PMI, cEF, sEF) is null.</para>
/// <para>Complete E-factor. Roschangar et al. describe cEF as assuming no recycling; the project spec subtracts
/// m_rec, and the spec is followed here. PMI − 1 gives the no-recycling figure.</para>
/// <para>Per-material parts of the ladder (<see cref="LossRung.Parts"/>): the auxiliaries rung is split by material,
/// each the mass charged under that material outside the equation less what was recovered of it; the excess-reactants
/// rung by reactant, m_r − ξ_max·ν_r·M_r (the limiting reactant's part is 0 up to rounding). Each set adds up to its
/// rung up to floating-point rounding (a solution's rest below 10⁻⁹ of its mass is not a part).</para>
/// <para>Solvent and water charged (<see cref="StepResult.SolventChargedKg"/>, <see cref="StepResult.WaterChargedKg"/>)
/// are the two halves of the m_sw,in above, counted the same way.</para>
/// </remarks>
public static class StepMetrics
{
    /// <summary>Relative window within which two n/ν values count as a tie.</summary>
    /// <remarks>
    /// An equimolar charge computed from rounded masses can differ in the last bits; without a window the
    /// reported limiting reactant would flip on rounding noise. Within the window the first reactant in
    /// equation order wins, so the choice is deterministic and readable; ξ_max is then that reactant's n/ν
    /// (at most 1e-9 relative above the strict minimum, far below any weighing uncertainty).
    /// </remarks>
    internal const double TieRelativeWindow = 1e-9;

    public static StepResult Compute(StepInput input)
    {
        ArgumentNullException.ThrowIfNull(input);
        var reaction = input.Reaction;
        var chargedByMaterial = SumAssayKgByMaterial(input.Charges);

        var missing = reaction.Reactants
            .Where(r => !(chargedByMaterial.GetValueOrDefault(r.Code) > 0))
            .Select(r => r.Code)
            .ToArray();
        var limiting = missing.Length == 0 ? FindLimiting(reaction.Reactants, chargedByMaterial) : null;
        double? maxExtent = limiting is null ? null : chargedByMaterial[limiting.Code] / limiting.MolarMassGPerMol / limiting.Coefficient;
        double? limitingKmol = maxExtent * limiting?.Coefficient;

        double reactantKg = reaction.Reactants.Sum(r => chargedByMaterial.GetValueOrDefault(r.Code));
        double actualKg = input.Outputs.Where(o => o.Kind == OutputKind.Product).Sum(o => o.ProductKg);
        double productInWasteKg = input.Outputs.Where(o => o.Kind == OutputKind.Waste).Sum(o => o.ProductKg);
        double productInSamplesKg = input.Outputs.Where(o => o.Kind == OutputKind.Sample).Sum(o => o.ProductKg);
        double inputKg = input.Charges.Sum(c => c.GrossKg);
        double recoveredKg = input.Outputs.Where(o => o.Kind == OutputKind.Recovered).Sum(o => o.GrossKg);
        double auxiliaryKg = inputKg - reactantKg;

        var reactantCodes = reaction.Reactants.Select(r => r.Code).ToHashSet(StringComparer.Ordinal);
        // A plain solvent or water row counts whole (its non-assay part is solvent too); a solution counts the
        // components whose own role is solvent or water (the water of 36 % hydrochloric acid), unless the equation
        // consumes them (the water of a hydration is a reactant, as ethanol of an esterification is).
        double solventWaterInKg = input.Charges.Sum(c => c.IsSolution
            ? c.Contents.Where(k => !reactantCodes.Contains(k.Material) && k.Role is AuxiliaryRole.Solvent or AuxiliaryRole.Water).Sum(k => k.Kg)
            : !reactantCodes.Contains(c.Material) && c.Role is AuxiliaryRole.Solvent or AuxiliaryRole.Water ? c.GrossKg : 0);
        double solventInKg = input.Charges.Sum(c => ChargedWithRole(c, AuxiliaryRole.Solvent, reactantCodes));
        double waterInKg = input.Charges.Sum(c => ChargedWithRole(c, AuxiliaryRole.Water, reactantCodes));
        double solventWaterRecoveredKg = input.Outputs
            .Where(o => o.Kind == OutputKind.Recovered && o.Role is AuxiliaryRole.Solvent or AuxiliaryRole.Water)
            .Sum(o => o.GrossKg);

        double? theoreticalKg = maxExtent * reaction.Product.MassPerExtent;
        double? stoichiometricKg = maxExtent * reaction.ReactantMassPerExtent;
        double actualExtent = actualKg / reaction.Product.MassPerExtent;
        double netInputKg = inputKg - recoveredKg;

        // With a reactant of the equation not recorded the step's inputs are known to be incomplete: every
        // figure that sets the product against what was charged (RME, RME_g, PMI, the E-factors) would be
        // computed from a wrong total, so they are not computable, like the yield, SF and theoretical.
        bool complete = missing.Length == 0;
        double? IfComplete(double? value) => complete ? value : null;

        return new StepResult
        {
            Reactants = reaction.Reactants
                .Select(r => Amount(r.Code, r.Coefficient, r.MolarMassGPerMol, chargedByMaterial.GetValueOrDefault(r.Code), limitingKmol))
                .ToArray(),
            Reagents = input.ReagentMolarMasses
                .Where(kv => chargedByMaterial.ContainsKey(kv.Key))
                .OrderBy(kv => kv.Key, StringComparer.Ordinal)
                .Select(kv => Amount(kv.Key, null, kv.Value, chargedByMaterial[kv.Key], limitingKmol))
                .ToArray(),
            MissingReactants = missing,
            LimitingReactant = limiting?.Code,
            MaxExtentKmol = maxExtent,
            ActualExtentKmol = actualExtent,
            TheoreticalProductKg = theoreticalKg,
            ActualProductKg = actualKg,
            YieldPct = theoreticalKg is { } theo ? SafeRatio.Of(100 * actualKg, theo) : null,
            AtomEconomyPct = reaction.AtomEconomyPct,
            StoichiometricReactantKg = stoichiometricKg,
            ReactantChargedKg = reactantKg,
            StoichiometricFactor = stoichiometricKg is { } stoich ? SafeRatio.Of(reactantKg, stoich) : null,
            ReactionMassEfficiencyPct = IfComplete(SafeRatio.Of(100 * actualKg, reactantKg)),
            InputKg = inputKg,
            AuxiliaryKg = auxiliaryKg,
            RecoveredKg = recoveredKg,
            MaterialRecoveryParameter = SafeRatio.Of(reactantKg, netInputKg),
            OverallReactionMassEfficiencyPct = IfComplete(SafeRatio.Of(100 * actualKg, netInputKg)),
            ProcessMassIntensity = IfComplete(SafeRatio.Of(inputKg, actualKg)),
            CompleteEFactor = IfComplete(SafeRatio.Of(netInputKg - actualKg, actualKg)),
            SimpleEFactor = IfComplete(SafeRatio.Of(
                inputKg - solventWaterInKg - (recoveredKg - solventWaterRecoveredKg) - actualKg, actualKg)),
            SolventAndWaterChargedKg = solventWaterInKg,
            SolventAndWaterRecoveredKg = solventWaterRecoveredKg,
            SolventChargedKg = solventInKg,
            WaterChargedKg = waterInKg,
            ProductInWasteKg = productInWasteKg,
            ProductInSamplesKg = productInSamplesKg,
            Ladder = theoreticalKg is { } t && stoichiometricKg is { } s
                ? LossLadder.Build(inputKg, auxiliaryKg, recoveredKg, reactantKg, s, t, actualKg, productInWasteKg, productInSamplesKg)
                    .WithParts(
                        AuxiliaryParts(input, reactantCodes),
                        reaction.Reactants.Select(r => new LadderPart(r.Code, chargedByMaterial[r.Code] - (maxExtent!.Value * r.MassPerExtent))).ToArray())
                : null,
            Balance = MassBalanceCalculator.Compute(input, inputKg, actualExtent, maxExtent),
        };
    }

    /// <summary>What one charge row puts in with <paramref name="role"/>: a plain row whole (gross), a solution its
    /// components with that role; nothing of a reactant of the equation.</summary>
    private static double ChargedWithRole(ChargeRow c, AuxiliaryRole role, HashSet<string> reactantCodes) => c.IsSolution
        ? c.Contents.Where(k => k.Role == role && !reactantCodes.Contains(k.Material)).Sum(k => k.Kg)
        : c.Role == role && !reactantCodes.Contains(c.Material) ? c.GrossKg : 0;

    /// <summary>
    /// m_aux − m_rec material by material, in order of first appearance: each charge row's mass that is not reactant
    /// (a plain auxiliary row whole, the non-assay part of a reactant row, a solution's non-reactant components and
    /// the part of its weighed mass no component accounts for, under the solution's code), less the recovered rows of
    /// that material. Empty when a recovered row does not name its material (the parts could not add up).
    /// </summary>
    private static IReadOnlyList<LadderPart> AuxiliaryParts(StepInput input, HashSet<string> reactantCodes)
    {
        var recovered = input.Outputs.Where(o => o.Kind == OutputKind.Recovered).ToArray();
        if (recovered.Any(o => o.Material is null))
        {
            return [];
        }

        var order = new List<string>();
        var kg = new Dictionary<string, double>(StringComparer.Ordinal);
        void Add(string material, double value)
        {
            if (!kg.ContainsKey(material))
            {
                order.Add(material);
                kg[material] = 0;
            }

            kg[material] += value;
        }

        foreach (var charge in input.Charges)
        {
            if (charge.IsSolution)
            {
                foreach (var content in charge.Contents.Where(k => !reactantCodes.Contains(k.Material)))
                {
                    Add(content.Material, content.Kg);
                }

                // Why the window: nominal shares summing to 100 % leave a rest of rounding noise, not a material.
                double rest = charge.GrossKg - charge.Contents.Sum(k => k.Kg);
                if (Math.Abs(rest) > charge.GrossKg * 1e-9)
                {
                    Add(charge.Material, rest);
                }
            }
            else
            {
                double auxiliary = reactantCodes.Contains(charge.Material) ? charge.GrossKg - charge.Contents[0].Kg : charge.GrossKg;
                if (auxiliary != 0)
                {
                    Add(charge.Material, auxiliary);
                }
            }
        }

        foreach (var row in recovered)
        {
            Add(row.Material!, -row.GrossKg);
        }

        return order.Select(m => new LadderPart(m, kg[m])).ToArray();
    }

    private static Dictionary<string, double> SumAssayKgByMaterial(IEnumerable<ChargeRow> charges)
    {
        var sums = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var charge in charges)
        {
            foreach (var content in charge.Contents)
            {
                sums[content.Material] = sums.GetValueOrDefault(content.Material) + content.Kg;
            }
        }

        return sums;
    }

    private static ReactionTerm FindLimiting(IReadOnlyList<ReactionTerm> reactants, Dictionary<string, double> chargedKg)
    {
        double PerCoefficient(ReactionTerm r) => chargedKg[r.Code] / r.MolarMassGPerMol / r.Coefficient;

        double minimum = reactants.Min(PerCoefficient);
        return reactants.First(r => PerCoefficient(r) <= minimum * (1 + TieRelativeWindow));
    }

    private static ChargedAmount Amount(string code, double? coefficient, double molarMass, double chargedKg, double? limitingKmol)
    {
        double kmol = chargedKg / molarMass;
        double? equivalents = limitingKmol is { } nL ? SafeRatio.Of(kmol, nL) : null;
        return new ChargedAmount(code, coefficient, molarMass, chargedKg, kmol, equivalents);
    }
}
