using MathNet.Numerics.LinearAlgebra;
using VoxProf.Core.Statistics;

namespace VoxProf.Tests.Statistics;

public class CollinearityTests
{
    private static Matrix<double> Columns(params double[][] columns) =>
        Matrix<double>.Build.Dense(columns[0].Length, columns.Length, (i, j) => columns[j][i]);

    [Fact]
    public void Orthogonal_columns_have_condition_number_one_and_no_dependency()
    {
        var report = Collinearity.Analyse(Columns([1, 0, 0, 0], [0, 3, 0, 0], [0, 0, 0, 7]));

        report.ConditionNumber.Should().BeApproximately(1, 1e-12);
        report.Dependencies.Should().BeEmpty();
    }

    [Fact]
    public void An_exact_multiple_is_an_exact_dependency_of_those_two_columns()
    {
        double[] a = [1, 2, 3, 4, 5], c = [2, 0, 1, 5, 1];
        var report = Collinearity.Analyse(Columns(a, c, a.Select(v => v * 3).ToArray()));

        report.ConditionNumber.Should().Be(double.PositiveInfinity);
        report.Dependencies.Should().ContainSingle().Which.Columns.Should().Equal(0, 2);
    }

    [Fact]
    public void A_near_sum_is_a_strong_dependency_of_the_three_columns_and_an_unrelated_column_stays_out()
    {
        // c ≈ a + b to one part in ten thousand; d is unrelated.
        var rng = new Random(3);
        double[] a = Enumerable.Range(0, 12).Select(_ => rng.NextDouble()).ToArray();
        double[] b = Enumerable.Range(0, 12).Select(_ => rng.NextDouble()).ToArray();
        double[] c = a.Zip(b, (x, y) => x + y + (rng.NextDouble() - 0.5) * 1e-4).ToArray();
        double[] d = Enumerable.Range(0, 12).Select(_ => rng.NextDouble() - 0.5).ToArray();

        var report = Collinearity.Analyse(Columns(a, d, b, c));

        report.ConditionNumber.Should().BeGreaterThan(1000);
        var dependency = report.Dependencies.Should().ContainSingle().Subject;
        dependency.Columns.Should().Equal(0, 2, 3);
        dependency.ConditionIndex.Should().BeApproximately(report.ConditionNumber, 1e-6 * report.ConditionNumber);
    }

    [Fact]
    public void The_condition_number_is_that_of_the_unit_length_columns()
    {
        // Scaling a column changes nothing: [1 1; 1 -1] has orthogonal columns whatever their lengths.
        var report = Collinearity.Analyse(Columns([1000, 1000], [0.001, -0.001]));
        report.ConditionNumber.Should().BeApproximately(1, 1e-9);
    }
}
