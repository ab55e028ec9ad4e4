using MathNet.Numerics.LinearAlgebra;
using VoxProf.Core.Statistics;

namespace VoxProf.Tests.Statistics;

public class NnlsTests
{
    [Fact]
    public void A_case_worked_by_hand_takes_a_variable_out_of_the_passive_set_on_the_way()
    {
        // A = [10 1; 0 1], b = [1; 2]. Unconstrained, x = A⁻¹b = (-0.1, 2): infeasible. Lawson & Hanson's steps:
        //  1. x = 0, w = Aᵀb = (10, 3): x1 enters. Least squares on column 1: z1 = (a1·b)/(a1·a1) = 10/100 = 0.1 > 0,
        //     so x = (0.1, 0).
        //  2. r = b − Ax = (0, 2), w = Aᵀr = (0, 2): x2 enters. Least squares on both (A is square): z = (-0.1, 2).
        //     z1 ≤ 0, so step back: α = x1 / (x1 − z1) = 0.1 / 0.2 = 0.5, x = x + α(z − x) = (0, 1); x1 = 0 leaves.
        //     Least squares on column 2 alone: z2 = (a2·b)/(a2·a2) = 3/2 = 1.5 > 0, so x = (0, 1.5).
        //  3. r = (1, 2) − 1.5·(1, 1) = (-0.5, 0.5), w = Aᵀr = (-5, 0): no free variable has w > 0, done.
        // Answer x = (0, 1.5), ‖r‖ = √0.5.
        var a = Matrix<double>.Build.DenseOfArray(new double[,] { { 10, 1 }, { 0, 1 } });
        var b = Vector<double>.Build.Dense([1.0, 2]);

        var result = Nnls.Solve(a, b);

        result.Converged.Should().BeTrue();
        result.X[0].Should().Be(0);
        result.X[1].Should().BeApproximately(1.5, 1e-14);
        result.ResidualNorm.Should().BeApproximately(Math.Sqrt(0.5), 1e-14);
        result.Gradient[0].Should().BeApproximately(-5, 1e-13);
        // Three sub-problems: one per variable entering, one after x1 left.
        result.Iterations.Should().Be(3);
    }

    [Fact]
    public void A_feasible_unconstrained_solution_is_returned_unchanged()
    {
        // b = A·(2, 3, 0.5) exactly: the unconstrained least-squares solution is non-negative, so NNLS must find it.
        var a = Matrix<double>.Build.DenseOfArray(new double[,] { { 1, 0, 2 }, { 0, 1, 1 }, { 1, 1, 0 }, { 2, 1, 1 } });
        var truth = Vector<double>.Build.Dense([2.0, 3, 0.5]);

        var result = Nnls.Solve(a, a * truth);

        (result.X - truth).AbsoluteMaximum().Should().BeLessThan(1e-12);
        result.ResidualNorm.Should().BeLessThan(1e-12);
    }

    [Fact]
    public void A_target_of_zero_or_a_negative_cone_gives_zero()
    {
        var a = Matrix<double>.Build.DenseOfArray(new double[,] { { 1, 2 }, { 3, 1 } });
        Nnls.Solve(a, Vector<double>.Build.Dense(2)).X.Should().Equal(0.0, 0.0);
        Nnls.Solve(a, Vector<double>.Build.Dense([-1.0, -1])).X.Should().Equal(0.0, 0.0);
    }

    [Fact]
    public void Duplicate_columns_converge_with_one_of_them_carrying_the_weight()
    {
        var a = Matrix<double>.Build.DenseOfArray(new double[,] { { 1, 1, 0 }, { 2, 2, 1 }, { 3, 3, 1 }, { 1, 1, 2 } });
        var b = a * Vector<double>.Build.Dense([1.0, 1, 2]);

        var result = Nnls.Solve(a, b);

        result.Converged.Should().BeTrue();
        (result.X[0] + result.X[1]).Should().BeApproximately(2, 1e-10);
        result.X[2].Should().BeApproximately(2, 1e-10);
        result.ResidualNorm.Should().BeLessThan(1e-10);
    }

    // The Karush–Kuhn–Tucker conditions of min ‖Ax − b‖² s.t. x ≥ 0 (Lawson & Hanson 1974, chapter 23, theorem 23.4):
    // x ≥ 0, and with w = Aᵀ(b − Ax): w_i ≤ 0 where x_i = 0 and w_i = 0 where x_i > 0. They are necessary and
    // sufficient for a minimum, so they check any answer without a second solver.
    [Fact]
    public void Seeded_random_problems_meet_the_Karush_Kuhn_Tucker_conditions()
    {
        var rng = new Random(20240515);
        for (int trial = 0; trial < 300; trial++)
        {
            int n = rng.Next(1, 9);
            int m = rng.Next(1, 14);
            var a = Matrix<double>.Build.Dense(m, n, (_, _) => rng.NextDouble() * 2 - 1);
            if (trial % 3 == 0)
            {
                // Non-negative data with widely differing column scales, like counter totals beside pixel counts.
                a = Matrix<double>.Build.Dense(m, n, (_, j) => rng.NextDouble() * Math.Pow(10, j));
            }
            var b = Vector<double>.Build.Dense(m, _ => rng.NextDouble() * 4 - 2);

            var result = Nnls.Solve(a, b);

            result.Converged.Should().BeTrue($"trial {trial}");
            double tol = 1e-9 * a.L1Norm() * Math.Max(1, b.L2Norm());
            var w = a.TransposeThisAndMultiply(b - a * result.X);
            for (int i = 0; i < n; i++)
            {
                result.X[i].Should().BeGreaterThanOrEqualTo(0, $"trial {trial}, x{i}");
                if (result.X[i] == 0)
                    w[i].Should().BeLessThanOrEqualTo(tol, $"trial {trial}, w{i} at a zero x{i}");
                else
                    Math.Abs(w[i]).Should().BeLessThanOrEqualTo(tol, $"trial {trial}, w{i} at a positive x{i}");
            }
        }
    }

    [Fact]
    public void Seeded_random_problems_reach_the_least_residual_of_every_feasible_active_set()
    {
        // Brute force: the optimum is the unconstrained solution on some subset of columns with every entry
        // positive; trying all 2ⁿ subsets finds the least residual any feasible point of that form reaches.
        var rng = new Random(77);
        for (int trial = 0; trial < 100; trial++)
        {
            int n = rng.Next(1, 6);
            int m = rng.Next(n, 10);
            var a = Matrix<double>.Build.Dense(m, n, (_, _) => rng.NextDouble() * 2 - 1);
            var b = Vector<double>.Build.Dense(m, _ => rng.NextDouble() * 4 - 2);

            double best = b.L2Norm();
            for (int mask = 1; mask < 1 << n; mask++)
            {
                int[] cols = Enumerable.Range(0, n).Where(j => (mask >> j & 1) == 1).ToArray();
                var sub = Matrix<double>.Build.Dense(m, cols.Length, (i, k) => a[i, cols[k]]);
                if (LeastSquares.TrySolve(sub, b, out var z) && z.All(v => v > 0))
                    best = Math.Min(best, (b - sub * z).L2Norm());
            }

            Nnls.Solve(a, b).ResidualNorm.Should().BeApproximately(best, 1e-9 * Math.Max(1, best), $"trial {trial}");
        }
    }
}
