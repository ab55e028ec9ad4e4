using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.LinearAlgebra.Factorization;

namespace VoxProf.Core.Statistics;

/// <summary>
/// Ordinary least squares, min ‖Ax − b‖₂, by MathNet's Householder QR: the factorisation works on A itself, so it
/// loses half as many digits as the normal equations AᵀA x = Aᵀb would on an ill-conditioned A.
/// </summary>
public static class LeastSquares
{
    /// <summary>
    /// The least-squares solution, or false when A has more columns than rows or its columns are (numerically)
    /// dependent: a diagonal entry of R at or below max(m, n)·ε times the largest one.
    /// </summary>
    public static bool TrySolve(Matrix<double> a, Vector<double> b, out Vector<double> x)
    {
        if (a.RowCount != b.Count)
            throw new ArgumentException("b must have one entry per row of a", nameof(b));
        x = Vector<double>.Build.Dense(a.ColumnCount);
        if (a.ColumnCount == 0)
            return true;
        if (a.RowCount < a.ColumnCount)
            return false;
        QR<double> qr = a.QR(QRMethod.Thin);
        Matrix<double> r = qr.R;
        double largest = 0;
        for (int i = 0; i < r.ColumnCount; i++)
            largest = Math.Max(largest, Math.Abs(r[i, i]));
        double floor = Math.Max(a.RowCount, a.ColumnCount) * Epsilon * largest;
        for (int i = 0; i < r.ColumnCount; i++)
        {
            if (!(Math.Abs(r[i, i]) > floor))
                return false;
        }
        x = qr.Solve(b);
        return x.All(double.IsFinite);
    }

    /// <summary>As <see cref="TrySolve"/>; throws when the columns are dependent.</summary>
    public static Vector<double> Solve(Matrix<double> a, Vector<double> b) =>
        TrySolve(a, b, out Vector<double> x) ? x : throw new ArgumentException("the columns of a are linearly dependent", nameof(a));

    /// <summary>Machine epsilon of double, 2⁻⁵².</summary>
    public const double Epsilon = 2.220446049250313e-16;
}
