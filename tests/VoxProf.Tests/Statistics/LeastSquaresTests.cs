using MathNet.Numerics.LinearAlgebra;
using VoxProf.Core.Statistics;

namespace VoxProf.Tests.Statistics;

public class LeastSquaresTests
{
    // NIST Statistical Reference Datasets (StRD), linear least squares, "Longley" (higher difficulty): Longley (1967),
    // employment y against six economic series x1..x6 for 1947-1962, with NIST's "certified values". Data and
    // certified values as published by NIST (itl.nist.gov/div898/strd/lls/data/Longley.shtml), read here from a
    // public copy, the Longley test of the Ruby binding of the GNU Scientific Library, which quotes them in full.
    // Columns: y, x1 (GNP deflator), x2 (GNP), x3 (unemployed), x4 (armed forces), x5 (population), x6 (year).
    private static readonly double[,] Longley =
    {
        { 60323, 83.0, 234289, 2356, 1590, 107608, 1947 },
        { 61122, 88.5, 259426, 2325, 1456, 108632, 1948 },
        { 60171, 88.2, 258054, 3682, 1616, 109773, 1949 },
        { 61187, 89.5, 284599, 3351, 1650, 110929, 1950 },
        { 63221, 96.2, 328975, 2099, 3099, 112075, 1951 },
        { 63639, 98.1, 346999, 1932, 3594, 113270, 1952 },
        { 64989, 99.0, 365385, 1870, 3547, 115094, 1953 },
        { 63761, 100.0, 363112, 3578, 3350, 116219, 1954 },
        { 66019, 101.2, 397469, 2904, 3048, 117388, 1955 },
        { 67857, 104.6, 419180, 2822, 2857, 118734, 1956 },
        { 68169, 108.4, 442769, 2936, 2798, 120445, 1957 },
        { 66513, 110.8, 444546, 4681, 2637, 121950, 1958 },
        { 68655, 112.6, 482704, 3813, 2552, 123366, 1959 },
        { 69564, 114.2, 502601, 3931, 2514, 125368, 1960 },
        { 69331, 115.7, 518173, 4806, 2572, 127852, 1961 },
        { 70551, 116.9, 554894, 4007, 2827, 130081, 1962 },
    };

    // NIST's certified values: B0 (intercept) .. B6, and the residual standard deviation.
    private static readonly double[] CertifiedB =
    [
        -3482258.63459582, 15.0618722713733, -0.358191792925910E-01, -2.02022980381683,
        -1.03322686717359, -0.511041056535807E-01, 1829.15146461355,
    ];

    private const double CertifiedResidualSd = 304.854073561965;

    [Fact]
    public void Longley_coefficients_and_residual_standard_deviation_match_the_NIST_certified_values()
    {
        int n = Longley.GetLength(0);
        var a = Matrix<double>.Build.Dense(n, 7, (i, j) => j == 0 ? 1 : Longley[i, j]);
        var y = Vector<double>.Build.Dense(n, i => Longley[i, 0]);

        var b = LeastSquares.Solve(a, y);

        // Longley's columns are nearly dependent (NIST rates the set of higher difficulty): seven digits is the
        // bar here, which Householder QR in double precision clears.
        for (int j = 0; j < 7; j++)
            b[j].Should().BeApproximately(CertifiedB[j], Math.Abs(CertifiedB[j]) * 1e-7, $"B{j}");
        double residualSd = Math.Sqrt((y - a * b).L2Norm() * (y - a * b).L2Norm() / (n - 7));
        residualSd.Should().BeApproximately(CertifiedResidualSd, CertifiedResidualSd * 1e-8);
    }

    [Fact]
    public void Dependent_columns_are_refused_rather_than_solved_with_noise()
    {
        var a = Matrix<double>.Build.DenseOfArray(new double[,] { { 1, 2 }, { 2, 4 }, { 3, 6 } });
        var y = Vector<double>.Build.Dense([1.0, 2, 3]);

        LeastSquares.TrySolve(a, y, out _).Should().BeFalse();
        LeastSquares.TrySolve(a.SubMatrix(0, 3, 0, 1), y, out var x).Should().BeTrue();
        x[0].Should().BeApproximately(1, 1e-12);
    }

    [Fact]
    public void More_columns_than_rows_is_refused()
    {
        var a = Matrix<double>.Build.DenseOfArray(new double[,] { { 1, 2, 3 }, { 4, 5, 7 } });
        LeastSquares.TrySolve(a, Vector<double>.Build.Dense([1.0, 2]), out _).Should().BeFalse();
    }
}
