using MathNet.Numerics.LinearAlgebra;

namespace VoxProf.Core.Statistics;

/// <summary>The answer of <see cref="Nnls.Solve"/>.</summary>
/// <param name="X">The solution; every entry is 0 or positive.</param>
/// <param name="Gradient">w = Aᵀ(b − Ax) at <paramref name="X"/>, the Karush–Kuhn–Tucker multipliers: at the optimum
/// w_i ≤ <paramref name="Tolerance"/> where x_i = 0 and |w_i| ≤ tolerance where x_i &gt; 0.</param>
/// <param name="ResidualNorm">‖b − Ax‖₂.</param>
/// <param name="Iterations">Least-squares sub-problems solved, main and inner loop together.</param>
/// <param name="Converged">False when the iteration limit stopped the loop: X is then feasible but may not be optimal.</param>
public sealed record NnlsResult(Vector<double> X, Vector<double> Gradient, double ResidualNorm, int Iterations, bool Converged, double Tolerance);

/// <summary>
/// Non-negative least squares, min ‖Ax − b‖₂ subject to x ≥ 0, by the active-set algorithm of Lawson &amp; Hanson,
/// "Solving Least Squares Problems" (1974), chapter 23, algorithm NNLS. The unconstrained sub-problem on the passive
/// (positive) variables is solved by <see cref="LeastSquares"/> (MathNet's Householder QR).
/// </summary>
public static class Nnls
{
    /// <param name="tolerance">How far above 0 a multiplier w_j must be for variable j to enter; default
    /// <see cref="DefaultTolerance"/>.</param>
    /// <param name="maxIterations">Limit on sub-problems solved; default 30n + 30.</param>
    public static NnlsResult Solve(Matrix<double> a, Vector<double> b, double? tolerance = null, int? maxIterations = null)
    {
        if (a.RowCount != b.Count)
            throw new ArgumentException("b must have one entry per row of a", nameof(b));
        int n = a.ColumnCount;
        double tol = tolerance ?? DefaultTolerance(a, b);
        // A safety net, not an expected bound: Lawson & Hanson's own routine allows 3n inner steps, and these
        // problems (a handful of costs) finish in about n main steps.
        int limit = maxIterations ?? 30 * n + 30;
        var x = Vector<double>.Build.Dense(n);
        var passive = new bool[n];
        var refused = new bool[n];
        int iterations = 0;
        bool converged = true;
        Vector<double> w = Gradient(a, b, x);

        while (true)
        {
            // Free the variable whose increase lowers the residual fastest; none left means the KKT conditions hold.
            int t = -1;
            for (int j = 0; j < n; j++)
            {
                if (!passive[j] && !refused[j] && w[j] > tol && (t < 0 || w[j] > w[t]))
                    t = j;
            }
            if (t < 0)
                break;
            if (++iterations > limit)
            {
                converged = false;
                break;
            }
            passive[t] = true;
            if (!SolvePassive(a, b, passive, out Vector<double> z) || !(z[t] > 0))
            {
                // Column t is numerically a combination of the passive ones, or rounding made its step useless:
                // Lawson & Hanson set w_t = 0 and choose again.
                passive[t] = false;
                refused[t] = true;
                continue;
            }

            // Step from x towards z only as far as keeps every passive variable non-negative; a variable that
            // reaches 0 leaves the passive set, and the sub-problem is solved again without it.
            while (AnyNonPositive(z, passive))
            {
                if (++iterations > limit)
                {
                    converged = false;
                    break;
                }
                double alpha = double.PositiveInfinity;
                int q = -1;
                for (int j = 0; j < n; j++)
                {
                    if (passive[j] && z[j] <= 0)
                    {
                        double step = x[j] / (x[j] - z[j]);
                        if (step < alpha)
                        {
                            alpha = step;
                            q = j;
                        }
                    }
                }
                for (int j = 0; j < n; j++)
                {
                    if (passive[j])
                        x[j] += alpha * (z[j] - x[j]);
                }
                x[q] = 0;
                for (int j = 0; j < n; j++)
                {
                    if (passive[j] && x[j] <= 0)
                    {
                        passive[j] = false;
                        x[j] = 0;
                    }
                }
                if (!SolvePassive(a, b, passive, out z))
                {
                    converged = false;
                    break;
                }
            }
            if (!converged)
                break;
            z.CopyTo(x);
            w = Gradient(a, b, x);
            Array.Clear(refused);
        }
        w = Gradient(a, b, x);
        return new NnlsResult(x, w, (b - a * x).L2Norm(), iterations, converged, tol);
    }

    /// <summary>
    /// 10 · ε · max(m, n) · ‖A‖₁ · ‖b‖₂: rounding noise in w = Aᵀ(b − Ax), which scales with both A and b. The
    /// 10 · ε · max(m, n) · ‖A‖₁ part is common practice in NNLS routines; the ‖b‖₂ factor makes the test
    /// independent of the units b is measured in.
    /// </summary>
    public static double DefaultTolerance(Matrix<double> a, Vector<double> b) =>
        10 * LeastSquares.Epsilon * Math.Max(a.RowCount, a.ColumnCount) * a.L1Norm() * Math.Max(b.L2Norm(), double.Epsilon);

    private static Vector<double> Gradient(Matrix<double> a, Vector<double> b, Vector<double> x) =>
        a.TransposeThisAndMultiply(b - a * x);

    private static bool AnyNonPositive(Vector<double> z, bool[] passive)
    {
        for (int j = 0; j < passive.Length; j++)
        {
            if (passive[j] && z[j] <= 0)
                return true;
        }
        return false;
    }

    /// <summary>The unconstrained least-squares solution on the passive columns, 0 elsewhere.</summary>
    private static bool SolvePassive(Matrix<double> a, Vector<double> b, bool[] passive, out Vector<double> z)
    {
        z = Vector<double>.Build.Dense(passive.Length);
        int[] columns = Enumerable.Range(0, passive.Length).Where(j => passive[j]).ToArray();
        if (columns.Length == 0)
            return true;
        var sub = Matrix<double>.Build.Dense(a.RowCount, columns.Length, (i, k) => a[i, columns[k]]);
        if (!LeastSquares.TrySolve(sub, b, out Vector<double> zp))
            return false;
        for (int k = 0; k < columns.Length; k++)
            z[columns[k]] = zp[k];
        return true;
    }
}
