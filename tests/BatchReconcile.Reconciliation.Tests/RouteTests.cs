using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Tests;

/// <summary>Steps of one batch are linked (issue 9, point 6), on the three-step <see cref="AmineRoute"/>.</summary>
public class RouteTests
{
    [Fact]
    public void An_overdrawn_intermediate_is_flagged_naming_both_steps_and_both_masses()
    {
        // S1 isolates 147.0 kg of PAA; S2 charges 190.0 kg. Allowed: 147.0 × (1 + 3.0/100) = 151.41 kg (S2's tolerance).
        var batch = AmineRoute.Reconcile(AmineRoute.Rows(paaKg: 190.0));
        var s2 = batch.Steps[1];
        var f = Assert.Single(s2.Flags, f => f.Code == FlagCode.IntermediateOverdrawn);
        Assert.Equal((FlagSeverity.Major, "S2", "PAA", "kg"), (f.Severity, f.Step, f.Subject, f.Unit));
        Assert.Equal(190.0, f.Measured);
        Close.Equal(151.41, f.Limit, "allowed");
        Assert.Contains("Step S2 (Hofmann rearrangement) charged 190 kg of PAA, but step S1 (nitrile hydration) isolated only 147 kg of it in this batch, 43 kg more", f.Message, StringComparison.Ordinal);
        Assert.Contains("tolerance of 3 % (151.41 kg)", f.Message, StringComparison.Ordinal);

        var link = Assert.Single(batch.Links, l => l.ToStep == "S2");
        Assert.Equal(("PAA", "S1", "overdrawn", 0.0), (link.Material, link.FromStep, link.State, link.HeldBackKg));

        // The symptoms it explains are raised as before; S2's limiting reactant is now NaOCl (1.25942 kmol < 190/135.166 = 1.40568).
        Assert.Contains(s2.Flags, x => x.Code == FlagCode.YieldLow);
        Assert.Contains(s2.Flags, x => x.Code == FlagCode.BalanceGap);
        Assert.Equal("NAOCL", s2.LimitingReactant);
    }

    [Fact]
    public void The_overdrawn_severity_follows_the_site_and_step_settings()
    {
        var settings = new Settings.ReconciliationSettings { Severities = new() { ["intermediate-overdrawn"] = "critical" } };
        var f = AmineRoute.Reconcile(AmineRoute.Rows(paaKg: 190.0), settings: settings).Flags.Single(x => x.Code == FlagCode.IntermediateOverdrawn);
        Assert.Equal(FlagSeverity.Critical, f.Severity);
    }

    [Theory]
    // S2's tolerance is 3.0 % of the 147.0 kg isolated: 151.41 kg is on the limit (not flagged), 151.5 kg above it.
    [InlineData(151.41, "matched", false)]
    [InlineData(151.5, "overdrawn", true)]
    [InlineData(147.0, "matched", false)]
    [InlineData(145.0, "held-back", false)]
    public void Charged_against_isolated(double paaKg, string state, bool flagged)
    {
        var batch = AmineRoute.Reconcile(AmineRoute.Rows(paaKg: paaKg));
        Assert.Equal(state, batch.Links.Single(l => l.ToStep == "S2").State);
        Assert.Equal(flagged, batch.Flags.Any(f => f.Code == FlagCode.IntermediateOverdrawn));
    }

    [Fact]
    public void Held_back_intermediate_is_reported_not_flagged()
    {
        var batch = AmineRoute.Reconcile(AmineRoute.Rows(paaKg: 145.0));
        Assert.Equal(
            [("PAA", "S1", "S2", 147.0, 145.0, "held-back"), ("BNA", "S2", "S3", 95.0, 95.0, "matched")],
            batch.Links.Select(l => (l.Material, l.FromStep, l.ToStep, l.IsolatedKg, l.ChargedKg, l.State)));
        Close.Equal(2.0, batch.Links[0].HeldBackKg, "held back");
        Assert.Empty(batch.Flags);
    }

    [Fact]
    public void Route_yield_against_a_hand_calculation()
    {
        // Step 1's limiting reactant: BCN 148.5 / 117.151 = 1.267595 kmol. Every step is 1:1 in its intermediate
        // (ν_PAA/ν_BCN = 1, ν_BNA/ν_PAA = 1, ν_salt/ν_BNA = 1), so the route can make 1.267595 kmol of the salt:
        // m_theo,route = 1.267595 × 143.614 = 182.044 kg. Isolated 120.0 kg: Y_route = 100 × 120.0 / 182.044 = 65.918 %.
        var batch = AmineRoute.Reconcile(AmineRoute.Rows());
        Close.Equal(148.5 / Mw.BenzylCyanide * Mw.BenzylamineHcl, batch.Route.TheoreticalKg, "route theoretical");
        Close.Equal(100 * 120.0 / (148.5 / Mw.BenzylCyanide * Mw.BenzylamineHcl), batch.Route.YieldPct, "route yield");
        Assert.Equal(65.918, batch.Route.YieldPct!.Value, 3);
        Assert.Null(batch.Route.Reason);

        // Cross-check: the product of the step yields and of the share of each intermediate carried on
        // (145.0 of 147.0 kg; 95.0 of 95.0 kg): 85.796 % × (145/147) × 82.643 % × 94.249 % = 65.918 %.
        double product = batch.Steps.Aggregate(1.0, (p, s) => p * s.YieldPct!.Value / 100) * (145.0 / 147.0) * 100;
        Close.Equal(product, batch.Route.YieldPct, "step yields × carried shares");
    }

    [Fact]
    public void Route_yield_does_not_depend_on_how_a_step_equation_is_scaled()
    {
        // The Hofmann step written per 2 PAA (every coefficient doubled): the ratio ν_BNA/ν_PAA = 2/2 is still 1, so the
        // route figure must not change.
        var doubled = Plant.Step(
            "S2", "Hofmann rearrangement",
            Plant.Reaction([(2, "PAA"), (2, "NAOCL"), (4, "NAOH")], [(2, "BNA"), (2, "NA2CO3"), (2, "NACL"), (2, "WATER")]),
            "BNA", 75, 90, 3.0);
        var batch = AmineRoute.Reconcile(AmineRoute.Rows(), AmineRoute.Recipe(AmineRoute.S1(), doubled, AmineRoute.S3()));
        Close.Equal(148.5 / Mw.BenzylCyanide * Mw.BenzylamineHcl, batch.Route.TheoreticalKg, "route theoretical");
    }

    [Fact]
    public void Route_yield_is_not_computable_when_a_later_step_is_limited_by_another_reactant()
    {
        var batch = AmineRoute.Reconcile(AmineRoute.Rows(paaKg: 190.0));
        Assert.Null(batch.Route.YieldPct);
        Assert.Null(batch.Route.TheoreticalKg);
        Assert.Equal("step S2 was limited by NAOCL, not by the intermediate PAA, so the route's stoichiometry does not decide its product", batch.Route.Reason);
    }

    [Fact]
    public void Route_yield_is_not_computable_when_a_step_is_missing_and_no_link_crosses_the_gap()
    {
        var batch = AmineRoute.Reconcile(AmineRoute.Rows(withS2: false));
        Assert.Equal("step S2 has no rows", batch.Route.Reason);
        Assert.Null(batch.Route.YieldPct);
        Assert.Empty(batch.Links);
        Assert.Equal([FlagCode.StepMissing], batch.Flags.Select(f => f.Code));
    }

    [Fact]
    public void Route_yield_is_not_computable_when_a_step_does_not_take_the_previous_product()
    {
        // S3 moved before S2: S2 (Hofmann) does not take S3's salt.
        var batch = AmineRoute.Reconcile(AmineRoute.Rows(), AmineRoute.Recipe(AmineRoute.S1(), AmineRoute.S3(), AmineRoute.S2()));
        Assert.Equal("step S3 does not take the product of step S1 (PAA) in its equation", batch.Route.Reason);
    }
}
