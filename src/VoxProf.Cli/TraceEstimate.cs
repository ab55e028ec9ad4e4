namespace VoxProf.Cli;

/// <summary>
/// Time left in a trace of several strategies, from the rows finished so far. Two things make a plain rows-per-second
/// estimate swing: the grid reference costs about ten times a tree strategy per row, and rows differ in cost (sky at
/// the top is cheap, ground below is not). So:
/// <list type="bullet">
/// <item>No estimate while the first strategy runs: nothing is known yet about how cost spreads over the rows.</item>
/// <item>The current strategy's total time is its elapsed time over the share of time a finished strategy had spent
/// by the same row (its row profile), so cheap rows at the top do not make it look fast; in its first rows, the mean
/// time of the finished strategies of its kind.</item>
/// <item>A strategy not started yet takes the mean time of the finished ones of its kind (grid or tree), or the
/// current one's estimate if that is of its kind; if neither exists there is no estimate.</item>
/// <item>The finish time shown is smoothed (exponentially, weight <see cref="Smoothing"/> per update), so one tile
/// more or less does not move it.</item>
/// </list>
/// </summary>
internal sealed class TraceEstimate
{
    /// <summary>Weight of the newest estimate of the finish time (common practice for a progress display).</summary>
    public const double Smoothing = 0.3;

    /// <summary>Below this share of a profile's time the ratio elapsed/share is too noisy to use.</summary>
    private const double MinProfileShare = 0.02;

    private readonly int _height;
    private readonly bool[] _isGrid;
    private readonly double[] _seconds;
    private readonly double[][] _profiles;
    private readonly List<(int Rows, double Seconds)> _current = [];
    private int _strategy;
    private double _strategyStart;
    private double? _smoothedFinish;

    /// <param name="height">Image rows per strategy.</param>
    /// <param name="isGrid">Per strategy in trace order: true for the grid reference, whose cost per row differs.</param>
    public TraceEstimate(int height, IReadOnlyList<bool> isGrid)
    {
        _height = Math.Max(1, height);
        _isGrid = isGrid.ToArray();
        _seconds = new double[_isGrid.Length];
        _profiles = new double[_isGrid.Length][];
    }

    /// <summary>The strategy being traced (its index in trace order).</summary>
    public int Strategy => _strategy;

    /// <summary>Rows of the current strategy finished.</summary>
    public int RowsInStrategy { get; private set; }

    /// <summary>Records that <paramref name="rowsDone"/> rows (summed over strategies) were finished by <paramref name="seconds"/>.</summary>
    public void Observe(int rowsDone, double seconds)
    {
        int strategy = Math.Min(_isGrid.Length - 1, rowsDone / _height);
        while (_strategy < strategy)
            FinishStrategy(seconds);
        RowsInStrategy = Math.Min(_height, rowsDone - _strategy * _height);
        if (_current.Count == 0 || RowsInStrategy > _current[^1].Rows)
            _current.Add((RowsInStrategy, seconds - _strategyStart));
    }

    /// <summary>Seconds left, smoothed; null while too little is known.</summary>
    public double? SecondsLeft(double now)
    {
        if (Finish(now) is not { } finish)
            return null;
        _smoothedFinish = _smoothedFinish is { } s ? s + Smoothing * (finish - s) : finish;
        return Math.Max(0, _smoothedFinish.Value - now);
    }

    /// <summary>The unsmoothed estimate of the time the whole trace ends, or null.</summary>
    public double? Finish(double now)
    {
        double elapsed = now - _strategyStart;
        double? current = CurrentTotal(elapsed);
        if (current is null)
            return null;
        double left = Math.Max(0, current.Value - elapsed);
        for (int j = _strategy + 1; j < _isGrid.Length; j++)
        {
            double? pending = Mean(_isGrid[j]) ?? (_isGrid[j] == _isGrid[_strategy] ? current : null);
            if (pending is null)
                return null;
            left += pending.Value;
        }
        return now + left;
    }

    /// <summary>The current strategy's whole time: from a row profile once it is far enough in, else a finished one's of its kind.</summary>
    private double? CurrentTotal(double elapsed)
    {
        if (RowsInStrategy >= _height)
            return elapsed;
        double[]? profile = Profile(_isGrid[_strategy]);
        if (profile is not null && RowsInStrategy > 0 && profile[RowsInStrategy] >= MinProfileShare)
            return Math.Max(elapsed, elapsed / profile[RowsInStrategy]);
        return Mean(_isGrid[_strategy]) is { } mean ? Math.Max(elapsed, mean) : null;
    }

    /// <summary>The latest finished profile of the same kind, else the latest of any kind: rows cost alike in both.</summary>
    private double[]? Profile(bool grid)
    {
        double[]? any = null;
        for (int j = _strategy - 1; j >= 0; j--)
        {
            if (_profiles[j] is null)
                continue;
            if (_isGrid[j] == grid)
                return _profiles[j];
            any ??= _profiles[j];
        }
        return any;
    }

    private double? Mean(bool grid)
    {
        double sum = 0;
        int n = 0;
        for (int j = 0; j < _strategy; j++)
        {
            if (_isGrid[j] == grid)
            {
                sum += _seconds[j];
                n++;
            }
        }
        return n > 0 ? sum / n : null;
    }

    /// <summary>Closes the current strategy at <paramref name="seconds"/>: its time, and its share of time by each row.</summary>
    private void FinishStrategy(double seconds)
    {
        double total = Math.Max(1e-9, seconds - _strategyStart);
        _current.Add((_height, total));
        var profile = new double[_height + 1];
        int k = 0;
        (int Rows, double Seconds) previous = (0, 0);
        for (int rows = 0; rows <= _height; rows++)
        {
            while (k < _current.Count && _current[k].Rows < rows)
                previous = _current[k++];
            (int Rows, double Seconds) next = k < _current.Count ? _current[k] : (_height, total);
            // Linear between the two samples around this row count.
            double t = next.Rows == previous.Rows ? next.Seconds
                : previous.Seconds + (next.Seconds - previous.Seconds) * (rows - previous.Rows) / (next.Rows - previous.Rows);
            profile[rows] = Math.Clamp(t / total, 0, 1);
        }
        _seconds[_strategy] = total;
        _profiles[_strategy] = profile;
        _current.Clear();
        _strategy++;
        _strategyStart = seconds;
        RowsInStrategy = 0;
    }
}
