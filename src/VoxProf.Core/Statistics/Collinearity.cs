using MathNet.Numerics.LinearAlgebra;

namespace VoxProf.Core.Statistics;

/// <summary>A near-linear dependency among columns of a design matrix.</summary>
/// <param name="ConditionIndex">σ_max / σ_k of the column-scaled matrix; infinity for an exact dependency.</param>
/// <param name="Columns">The columns taking part, by index, in ascending order.</param>
public sealed record Dependency(double ConditionIndex, IReadOnlyList<int> Columns);

/// <summary>The collinearity diagnostics of a design matrix: its condition number and each strong dependency.</summary>
public sealed record CollinearityReport(double ConditionNumber, IReadOnlyList<Dependency> Dependencies);

/// <summary>
/// Collinearity diagnostics of Belsley, Kuh &amp; Welsch, "Regression Diagnostics" (1980), chapter 3: scale every
/// column to unit length (not centred), take the singular value decomposition X = U Σ Vᵀ, and for each singular
/// value σ_k its condition index η_k = σ_max / σ_k and the variance-decomposition proportions
/// π_kj = (v_jk² / σ_k²) / Σ_l (v_jl² / σ_l²), the share of coefficient j's variance that dependency k carries.
/// A dependency is strong when η_k reaches <see cref="StrongIndex"/> and two or more coefficients have π_kj of at
/// least <see cref="ProportionThreshold"/>: their split of the fit is then decided by noise, not by the data.
/// </summary>
public static class Collinearity
{
    /// <summary>BKW's threshold for a strong dependency (from memory: they treat 30 and above as strong).</summary>
    public const double StrongIndex = 30;

    /// <summary>BKW's threshold on the variance-decomposition proportion (from memory: 0.5).</summary>
    public const double ProportionThreshold = 0.5;

    // Below this share of σ_max a singular value is rounding noise: the dependency is exact, the proportions
    // meaningless, and the columns taking part are those with a visible weight in the singular vector.
    private const double ExactRatio = 1e-12;
    private const double ExactWeight = 0.01;

    /// <summary>Diagnoses <paramref name="x"/> (rows × columns, rows ≥ columns); an all-zero column is left to the caller.</summary>
    public static CollinearityReport Analyse(Matrix<double> x)
    {
        int p = x.ColumnCount;
        if (p == 0)
            return new CollinearityReport(1, []);
        var scaled = x.Clone();
        for (int j = 0; j < p; j++)
        {
            double norm = scaled.Column(j).L2Norm();
            if (norm > 0)
                scaled.SetColumn(j, scaled.Column(j) / norm);
        }
        var svd = scaled.Svd(computeVectors: true);
        // The factorisation gives min(rows, columns) singular values; a column beyond the rows is a dependency.
        double[] sigma = Enumerable.Range(0, p).Select(k => k < svd.S.Count ? svd.S[k] : 0).ToArray();
        Matrix<double> v = svd.VT.Transpose();
        double top = sigma.Max();
        if (!(top > 0))
            return new CollinearityReport(double.PositiveInfinity, [new Dependency(double.PositiveInfinity, Enumerable.Range(0, p).ToArray())]);

        var phiSum = new double[p];
        for (int j = 0; j < p; j++)
        {
            for (int k = 0; k < p; k++)
            {
                if (sigma[k] > top * ExactRatio)
                    phiSum[j] += v[j, k] * v[j, k] / (sigma[k] * sigma[k]);
            }
        }

        var dependencies = new List<Dependency>();
        for (int k = 0; k < p; k++)
        {
            if (sigma[k] <= top * ExactRatio)
            {
                int[] exact = Enumerable.Range(0, p).Where(j => v[j, k] * v[j, k] >= ExactWeight).ToArray();
                dependencies.Add(new Dependency(double.PositiveInfinity, exact));
                continue;
            }
            double index = top / sigma[k];
            if (index < StrongIndex)
                continue;
            int[] columns = Enumerable.Range(0, p)
                .Where(j => v[j, k] * v[j, k] / (sigma[k] * sigma[k]) / phiSum[j] >= ProportionThreshold).ToArray();
            if (columns.Length >= 2)
                dependencies.Add(new Dependency(index, columns));
        }
        double smallest = sigma.Min();
        double condition = smallest <= top * ExactRatio ? double.PositiveInfinity : top / smallest;
        return new CollinearityReport(condition, dependencies.OrderByDescending(d => d.ConditionIndex).ToArray());
    }
}
