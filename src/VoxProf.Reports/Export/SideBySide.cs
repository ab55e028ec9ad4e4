using System.Runtime.ExceptionServices;

namespace VoxProf.Reports.Export;

/// <summary>
/// Independent pieces of work run side by side, at most one a core (each may hold a whole image's data), with the
/// outcome of running them one after another: every piece runs, and if any failed, the failure of the first in order
/// is thrown as it was thrown, whichever finished first, so a bad file still gets its one-line error.
/// </summary>
public static class SideBySide
{
    public static void For(int count, Action<int> body)
    {
        var failures = new Exception?[count];
        Parallel.For(0, count, new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount }, i =>
        {
            try
            {
                body(i);
            }
            catch (Exception ex)
            {
                failures[i] = ex;
            }
        });
        if (failures.FirstOrDefault(f => f is not null) is { } failure)
            ExceptionDispatchInfo.Throw(failure);
    }
}
