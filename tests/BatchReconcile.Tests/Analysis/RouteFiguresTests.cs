using BatchReconcile.RecipeAnalysis;

namespace BatchReconcile.Tests.Analysis;

/// <summary>
/// The route's cumulative PMI and complete E-factor (docs/analysis.md, "The route"), hand-worked on the lidocaine route
/// (LidocaineRoute: S1 charges 577.0 kg, S2 80.0 kg diethylamine and 300.0 kg toluene besides its intermediate, S3 45.0 kg
/// hydrochloric acid and 250.0 kg acetone besides its intermediate). Definition of PMI over a sequence of steps:
/// Jiménez-González et al., Org. Process Res. Dev. 15 (2011) 912.
/// </summary>
public class RouteFiguresTests
{
    [Fact]
    public void Every_intermediate_charged_whole_gives_all_raw_materials_over_the_final_product()
    {
        // m_in: S1 577.0, S2 88.0 + 80.0 + 300.0 = 468.0, S3 90.0 + 45.0 + 250.0 = 385.0; intermediates charged 88.0 and 90.0.
        // PMI = (577.0 + 468.0 + 385.0 - 88.0 - 90.0) / 95.0 = 1252.0 / 95.0 = 13.178947...
        // cEF = (1252.0 - 95.0) / 95.0 = 12.178947...
        RouteStepMass[] steps =
        [
            new("S1", 577.0, 0, 88.0, 0),
            new("S2", 468.0, 0, 90.0, 88.0),
            new("S3", 385.0, 0, 95.0, 90.0),
        ];

        Assert.Equal(1252.0 / 95.0, RouteFigures.CumulativePmi(steps)!.Value, 12);
        Assert.Equal(13.178947, RouteFigures.CumulativePmi(steps)!.Value, 6);
        Assert.Equal(12.178947, RouteFigures.CompleteEFactor(steps)!.Value, 6);
    }

    [Fact]
    public void Held_back_intermediate_scales_the_earlier_steps_by_the_share_that_went_on()
    {
        // S2 charges 84.0 of the 88.0 kg CDMA (m_in 84.0 + 80.0 + 300.0 = 464.0) and isolates 86.0 kg, of which S3 charges 81.7
        // (m_in 81.7 + 45.0 + 250.0 = 376.7) and isolates 86.2 kg; 50.0 kg toluene recovered at S2.
        // s3 = 1; s2 = 81.7 / 86.0 = 0.95; s1 = 0.95 · 84.0 / 88.0 = 0.9068182
        // PMI = (1 · (376.7 - 81.7) + 0.95 · (464.0 - 84.0) + 0.9068182 · 577.0) / 86.2 = (295.0 + 361.0 + 523.2341) / 86.2 = 13.68021
        // cEF = (1179.2341 - 0.95 · 50.0 - 86.2) / 86.2 = 1045.5341 / 86.2 = 12.12917
        RouteStepMass[] steps =
        [
            new("S1", 577.0, 0, 88.0, 0),
            new("S2", 464.0, 50.0, 86.0, 84.0),
            new("S3", 376.7, 0, 86.2, 81.7),
        ];

        Assert.Equal(13.68021, RouteFigures.CumulativePmi(steps)!.Value, 5);
        Assert.Equal(12.12917, RouteFigures.CompleteEFactor(steps)!.Value, 5);
    }

    [Theory]
    [InlineData(0.0, 90.0)] // no final product
    [InlineData(95.0, 0.0)] // an intermediate step isolated nothing, so its share cannot be set
    public void Without_a_product_to_divide_by_the_figures_are_not_computable(double finalKg, double middleKg)
    {
        RouteStepMass[] steps =
        [
            new("S1", 577.0, 0, 88.0, 0),
            new("S2", 468.0, 0, middleKg, 88.0),
            new("S3", 385.0, 0, finalKg, middleKg),
        ];

        Assert.Null(RouteFigures.CumulativePmi(steps));
        Assert.Null(RouteFigures.CompleteEFactor(steps));
    }

    [Fact]
    public void A_one_step_route_is_the_steps_own_pmi()
    {
        // PMI = m_in / m_act (docs/computation.md): 577.0 / 88.0.
        Assert.Equal(577.0 / 88.0, RouteFigures.CumulativePmi([new RouteStepMass("S1", 577.0, 0, 88.0, 0)])!.Value, 12);
    }
}
