namespace BatchReconcile.Analysis.Trends;

/// <summary>The centre line and limits of an individuals and moving-range (I-MR) chart, and the baseline they came from.</summary>
/// <param name="Mean">Centre line: the mean of the baseline values.</param>
/// <param name="Sigma">Estimated process standard deviation MRbar / d2.</param>
/// <param name="Ucl">Upper control limit Mean + 3 Sigma.</param>
/// <param name="Lcl">Lower control limit Mean - 3 Sigma.</param>
/// <param name="MeanMovingRange">MRbar: mean of the moving ranges inside the baseline.</param>
/// <param name="MovingRangeUcl">Upper limit of the moving-range chart D4 · MRbar (its lower limit is 0).</param>
/// <param name="BaselineStart">Index of the first baseline value.</param>
/// <param name="BaselineCount">Number of baseline values.</param>
/// <remarks>
/// Control limits describe what the process has been doing over the baseline, not what the
/// specification or the master record allows: a point inside them can still be out of specification,
/// and a point outside them can still be acceptable.
/// </remarks>
public sealed record ControlLimits(
    double Mean, double Sigma, double Ucl, double Lcl, double MeanMovingRange, double MovingRangeUcl, int BaselineStart, int BaselineCount);
