using BatchReconcile.Analysis.Losses;

namespace BatchReconcile.Analysis.Tests.Losses;

public class LossParetoTests
{
    [Fact]
    public void Rows_are_summed_per_step_rung_and_material_and_sorted_by_mass()
    {
        // Hand-worked: 200 kg charged; positive losses 30 + 12 + 8 = 50 kg; the -5 kg rung takes no share.
        LossEntry[] entries =
        [
            new("S1", "workup", "Work-up and handling", null, 10),
            new("S2", "excess", "Excess reactant", "AC2O", 12),
            new("S1", "workup", "Work-up and handling", null, 20),
            new("S2", "gap", "Unaccounted", null, -5),
            new("S1", "excess", "Excess reactant", "MEOH", 8),
        ];

        var rows = LossPareto.Build(entries, 200);

        Assert.Equal(
            [
                new ParetoRow("S1", "workup", "Work-up and handling", null, 30, 15, 60, 60),
                new ParetoRow("S2", "excess", "Excess reactant", "AC2O", 12, 6, 24, 84),
                new ParetoRow("S1", "excess", "Excess reactant", "MEOH", 8, 4, 16, 100),
                new ParetoRow("S2", "gap", "Unaccounted", null, -5, -2.5, 0, 100),
            ],
            rows);
    }

    [Fact]
    public void The_same_rung_for_different_materials_stays_apart()
    {
        var rows = LossPareto.Build(
            [new("S1", "excess", "Excess reactant", "A", 1), new("S1", "excess", "Excess reactant", "B", 3)], 10);

        Assert.Equal(["B", "A"], rows.Select(r => r.Material));
    }

    [Fact]
    public void Ties_are_ordered_by_step_rung_and_material()
    {
        var rows = LossPareto.Build(
            [new("S2", "a", "A", null, 5), new("S1", "b", "B", null, 5), new("S1", "a", "A", "Z", 5), new("S1", "a", "A", null, 5)], 100);

        Assert.Equal(["S1/a/", "S1/a/Z", "S1/b/", "S2/a/"], rows.Select(r => $"{r.Step}/{r.RungKey}/{r.Material}"));
    }

    [Fact]
    public void The_last_positive_row_reaches_exactly_one_hundred_percent()
    {
        var entries = Enumerable.Range(1, 7).Select(i => new LossEntry("S1", $"r{i}", $"Rung {i}", null, 0.1 * i));

        var rows = LossPareto.Build(entries, 3);

        Assert.Equal(100, rows[^1].CumulativeSharePct);
        Assert.Equal(100, rows.Sum(r => r.SharePct), 10);
    }

    [Fact]
    public void Without_positive_losses_every_share_is_zero()
    {
        var rows = LossPareto.Build([new("S1", "gap", "Unaccounted", null, -2), new("S1", "w", "Work-up", null, 0)], 50);

        Assert.All(rows, r => Assert.Equal((0.0, 0.0), (r.SharePct, r.CumulativeSharePct)));
        Assert.Equal([0.0, -2.0], rows.Select(r => r.Kg));
    }

    [Fact]
    public void No_entries_give_no_rows_whatever_the_charge()
    {
        Assert.Empty(LossPareto.Build([], 0));
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-1.0)]
    [InlineData(double.NaN)]
    public void A_charge_that_is_not_positive_is_refused(double charged) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => LossPareto.Build([new("S1", "w", "Work-up", null, 1)], charged));

    [Fact]
    public void A_mass_that_is_not_finite_is_refused_naming_the_rung()
    {
        var error = Assert.Throws<ArgumentException>(() => LossPareto.Build([new("S3", "vent", "Vented gas", null, double.NaN)], 10));
        Assert.Contains("S3/vent", error.Message, StringComparison.Ordinal);
    }
}
