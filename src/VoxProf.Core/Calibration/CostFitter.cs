using MathNet.Numerics.LinearAlgebra;
using VoxProf.Core.Statistics;

namespace VoxProf.Core.Calibration;

/// <summary>One measured frame: its GPU time, its pixel count and the frame total of each feature.</summary>
/// <param name="MeasuredMs">The GPU time the team measured, in ms; positive.</param>
/// <param name="Pixels">Pixels of the traced image (width × height).</param>
/// <param name="Totals">The sum over pixels of each feature, in the fit's feature order.</param>
public sealed record CalibrationSample(double MeasuredMs, long Pixels, IReadOnlyList<double> Totals);

/// <summary>How the model reproduces one sample.</summary>
/// <param name="FittedMs">The fitted model's time for the sample.</param>
/// <param name="ResidualMs">Measured − fitted.</param>
/// <param name="LooPredictedMs">The time predicted by the model fitted to every other sample.</param>
/// <param name="LooErrorMs">Measured − <paramref name="LooPredictedMs"/>: the residual of the sample when it is left out.</param>
public sealed record SampleFit(double MeasuredMs, double FittedMs, double ResidualMs, double LooPredictedMs, double LooErrorMs);

/// <summary>A fitted calibration with its diagnostics.</summary>
/// <param name="Terms">The per-pixel cost, then one per feature, in the order asked.</param>
/// <param name="RSquared">1 − Σ residual² / Σ (measured − mean)²; null when every measured time is the same.</param>
/// <param name="LooRSquared">The same with the leave-one-out errors in place of the residuals (the predicted R²).</param>
/// <param name="Collinearity">Belsley–Kuh–Welsch diagnostics of the design matrix; column 0 is the pixel count,
/// column k the k-th feature; all-zero columns are left out.</param>
/// <param name="Undetermined">Features that are 0 in every sample: their cost is not determined and is set to 0.</param>
/// <param name="Converged">False when the active-set loop hit its limit in the fit or in a leave-one-out fit.</param>
public sealed record CostFit(
    IReadOnlyList<CostTerm> Terms,
    IReadOnlyList<SampleFit> Samples,
    double? RSquared,
    double RmsResidualMs,
    double? LooRSquared,
    double LooRmsErrorMs,
    double LooMeanAbsPercent,
    CollinearityReport Collinearity,
    IReadOnlyList<MeasureDefinition> Undetermined,
    bool Converged);

/// <summary>
/// Fits GPU time as a non-negative sum: ms = Σ_k c_k · total_k + c_pixel · pixels, with totals per frame (per-pixel
/// mean × pixel count), by <see cref="Nnls"/>. Costs cannot be negative: a step never saves time, and an unconstrained
/// fit of correlated counters readily trades a large positive cost against a negative one.
/// </summary>
public static class CostFitter
{
    /// <summary>Fewest samples for <paramref name="features"/> features: one more than the costs (the features and the pixel cost).</summary>
    public static int MinimumSamples(int features) => features + 2;

    public static CostFit Fit(IReadOnlyList<MeasureDefinition> features, IReadOnlyList<CalibrationSample> samples)
    {
        if (samples.Count < MinimumSamples(features.Count))
            throw new ArgumentException($"{samples.Count} samples for {features.Count + 1} costs; at least {MinimumSamples(features.Count)} needed", nameof(samples));
        if (samples.Any(s => s.Totals.Count != features.Count))
            throw new ArgumentException("every sample needs one total per feature", nameof(samples));

        Matrix<double> a = Design(samples);
        Vector<double> b = Vector<double>.Build.Dense(samples.Count, i => samples[i].MeasuredMs);
        var (x, converged) = Solve(a, b);

        Vector<double> fitted = a * x;
        var loo = new double[samples.Count];
        for (int i = 0; i < samples.Count; i++)
        {
            int[] others = Enumerable.Range(0, samples.Count).Where(r => r != i).ToArray();
            var (xi, ok) = Solve(Rows(a, others), Vector<double>.Build.Dense(others.Length, k => b[others[k]]));
            converged &= ok;
            loo[i] = a.Row(i) * xi;
        }

        var rows = new SampleFit[samples.Count];
        for (int i = 0; i < rows.Length; i++)
            rows[i] = new SampleFit(b[i], fitted[i], b[i] - fitted[i], loo[i], b[i] - loo[i]);

        double mean = b.Average();
        double total = b.Sum(v => (v - mean) * (v - mean));
        double residual = rows.Sum(r => r.ResidualMs * r.ResidualMs);
        double press = rows.Sum(r => r.LooErrorMs * r.LooErrorMs);
        int[] used = Enumerable.Range(0, a.ColumnCount).Where(j => a.Column(j).AbsoluteMaximum() > 0).ToArray();
        CollinearityReport diagnosis = Collinearity.Analyse(Columns(a, used));

        var terms = new CostTerm[features.Count + 1];
        terms[0] = new CostTerm(null, x[0] * 1e6);
        for (int k = 0; k < features.Count; k++)
            terms[k + 1] = new CostTerm(features[k], x[k + 1] * 1e6);
        return new CostFit(
            terms,
            rows,
            total > 0 ? 1 - residual / total : null,
            Math.Sqrt(residual / rows.Length),
            total > 0 ? 1 - press / total : null,
            Math.Sqrt(press / rows.Length),
            rows.Average(r => Math.Abs(r.LooErrorMs) / r.MeasuredMs) * 100,
            diagnosis with { Dependencies = diagnosis.Dependencies.Select(d => d with { Columns = d.Columns.Select(c => used[c]).ToArray() }).ToArray() },
            features.Where((_, k) => !used.Contains(k + 1)).ToArray(),
            converged);
    }

    /// <summary>Column 0 the pixel count, then the feature totals.</summary>
    private static Matrix<double> Design(IReadOnlyList<CalibrationSample> samples) =>
        Matrix<double>.Build.Dense(samples.Count, samples[0].Totals.Count + 1,
            (i, j) => j == 0 ? samples[i].Pixels : samples[i].Totals[j - 1]);

    /// <summary>
    /// NNLS on unit-length columns, then back to ms per unit. Scaling a column by a positive factor keeps the
    /// problem the same (x ≥ 0 is kept), and totals of ten million beside pixel counts of a million would otherwise
    /// make the tolerance of the active-set test meaningless for the small columns.
    /// </summary>
    private static (Vector<double> X, bool Converged) Solve(Matrix<double> a, Vector<double> b)
    {
        var norms = new double[a.ColumnCount];
        Matrix<double> scaled = a.Clone();
        for (int j = 0; j < norms.Length; j++)
        {
            norms[j] = a.Column(j).L2Norm();
            if (norms[j] > 0)
                scaled.SetColumn(j, a.Column(j) / norms[j]);
        }
        NnlsResult result = Nnls.Solve(scaled, b);
        Vector<double> x = Vector<double>.Build.Dense(norms.Length, j => norms[j] > 0 ? result.X[j] / norms[j] : 0);
        return (x, result.Converged);
    }

    private static Matrix<double> Rows(Matrix<double> a, int[] rows) =>
        Matrix<double>.Build.Dense(rows.Length, a.ColumnCount, (i, j) => a[rows[i], j]);

    private static Matrix<double> Columns(Matrix<double> a, int[] columns) =>
        Matrix<double>.Build.Dense(a.RowCount, columns.Length, (i, j) => a[i, columns[j]]);
}
