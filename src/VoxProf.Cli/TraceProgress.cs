using System.Diagnostics;
using System.Globalization;

namespace VoxProf.Cli;

/// <summary>
/// Rows-done progress on one stderr line, redrawn at most every 200 ms. Reports arrive on worker threads, so this is a
/// plain synchronous <see cref="IProgress{T}"/> (Progress&lt;T&gt; would post to the thread pool and arrive out of order).
/// </summary>
internal sealed class TraceProgress : IProgress<int>
{
    private readonly TextWriter _error;
    private readonly int _totalRows;
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private readonly object _lock = new();
    private long _lastDrawMs = -1000;

    public TraceProgress(TextWriter error, int totalRows)
    {
        _error = error;
        _totalRows = Math.Max(1, totalRows);
    }

    public void Report(int rowsDone)
    {
        lock (_lock)
        {
            long now = _clock.ElapsedMilliseconds;
            if (now - _lastDrawMs < 200 && rowsDone < _totalRows)
                return;
            _lastDrawMs = now;
            _error.Write(Line(rowsDone, _totalRows, _clock.Elapsed));
            _error.Flush();
        }
    }

    public void Finish()
    {
        lock (_lock)
            _error.Write("\r" + new string(' ', 72) + "\r");
    }

    /// <summary>The text drawn for a state, e.g. "\rtracing: 360/3600 rows, 1.2 s elapsed, about 10.8 s left".</summary>
    public static string Line(int rowsDone, int totalRows, TimeSpan elapsed)
    {
        double fraction = Math.Clamp(rowsDone / (double)Math.Max(1, totalRows), 0, 1);
        string estimate = fraction > 0 ? $"about {(elapsed.TotalSeconds / fraction - elapsed.TotalSeconds).ToString("0.0", CultureInfo.InvariantCulture)} s left" : "estimating";
        return $"\rtracing: {rowsDone.ToString(CultureInfo.InvariantCulture)}/{totalRows.ToString(CultureInfo.InvariantCulture)} rows, {elapsed.TotalSeconds.ToString("0.0", CultureInfo.InvariantCulture)} s elapsed, {estimate}   ";
    }
}
