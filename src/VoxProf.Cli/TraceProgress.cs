using System.Diagnostics;
using System.Globalization;

namespace VoxProf.Cli;

/// <summary>
/// One stderr line, redrawn at most every 200 ms, through the phases of a trace: the tree build, each strategy by
/// name with its rows and an estimate of the time left (<see cref="TraceEstimate"/>), then each output being written.
/// Row reports arrive on worker threads, so this is a plain synchronous <see cref="IProgress{T}"/> (Progress&lt;T&gt;
/// would post to the thread pool and arrive out of order).
/// </summary>
internal sealed class TraceProgress : IProgress<int>, IProgress<string>
{
    private const int RedrawMs = 200;

    private readonly TextWriter _error;
    private readonly int _height;
    private readonly IReadOnlyList<string> _strategies;
    private readonly TraceEstimate _estimate;
    private readonly Stopwatch _clock = new();
    private readonly object _lock = new();
    private long _lastDrawMs = -1000;
    private int _lastLength;
    private readonly string _prefix;

    /// <param name="strategies">Strategy names in trace order; the tracer reports rows summed over them.</param>
    /// <param name="prefix">Put before every line: which view of a run of several ("view 3/72 walk#002: ").</param>
    public TraceProgress(TextWriter error, int height, IReadOnlyList<string> strategies, string prefix = "")
    {
        _prefix = prefix;
        _error = error;
        _height = Math.Max(1, height);
        _strategies = strategies;
        _estimate = new TraceEstimate(_height, strategies.Select(s => s == "grid").ToArray());
    }

    /// <summary>Shows a step that reports no rows ("building the tree", "writing heatmaps").</summary>
    public void Report(string step)
    {
        lock (_lock)
            Draw(step + " …");
    }

    /// <summary>Rows finished, summed over strategies; the first call starts the trace's clock.</summary>
    public void Report(int rowsDone)
    {
        lock (_lock)
        {
            if (!_clock.IsRunning)
                _clock.Start();
            double now = _clock.Elapsed.TotalSeconds;
            _estimate.Observe(rowsDone, now);
            long ms = _clock.ElapsedMilliseconds;
            if (ms - _lastDrawMs < RedrawMs)
                return;
            _lastDrawMs = ms;
            int k = _estimate.Strategy;
            Draw(Line(_strategies[k], k, _strategies.Count, _estimate.RowsInStrategy, _height, now, _estimate.SecondsLeft(now)));
        }
    }

    /// <summary>Clears the line, so the table that follows starts at the left margin.</summary>
    public void Finish()
    {
        lock (_lock)
        {
            _error.Write("\r" + new string(' ', _lastLength) + "\r");
            _error.Flush();
            _lastLength = 0;
        }
    }

    /// <summary>"tracing dda (3/5): 360/720 rows, 4.2 s, about 3 s left" (no estimate: "estimating time left").</summary>
    public static string Line(string strategy, int index, int count, int rows, int height, double seconds, double? secondsLeft)
    {
        var inv = CultureInfo.InvariantCulture;
        string left = secondsLeft is { } s ? $"about {Seconds(s)} left" : "estimating time left";
        return string.Create(inv, $"tracing {strategy} ({index + 1}/{count}): {rows}/{height} rows, {seconds:0.0} s, {left}");
    }

    /// <summary>Whole seconds above 10, so the figure does not flicker; tenths below.</summary>
    public static string Seconds(double s) =>
        s >= 10 ? string.Create(CultureInfo.InvariantCulture, $"{Math.Round(s):0} s") : string.Create(CultureInfo.InvariantCulture, $"{s:0.0} s");

    private void Draw(string text)
    {
        text = _prefix + text;
        // Pad over the previous text: a shorter line must not leave the end of a longer one behind.
        string padded = text.Length < _lastLength ? text + new string(' ', _lastLength - text.Length) : text;
        _error.Write("\r" + padded);
        _error.Flush();
        _lastLength = text.Length;
    }
}
