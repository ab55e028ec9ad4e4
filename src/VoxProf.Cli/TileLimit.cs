using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using VoxProf.Core;
using VoxProf.Core.Traversal;

namespace VoxProf.Cli;

/// <summary>
/// --tile-limit: how long one image tile of one strategy may take before the trace is stopped as hung. A strategy
/// file's loop that never ends cannot be interrupted, only reported, so a timer checks the tracer's
/// <see cref="TileWatch"/> and, on a stall, the command writes one line, throws its unfinished output away and exits
/// (docs/writing-a-strategy.md, "When a loop never ends"). Under a debugger the check is off: a breakpoint in a
/// strategy is not a hang.
/// </summary>
internal sealed class TileLimit
{
    /// <summary>
    /// A 16×16 tile of the slowest built-in (grid, memory model on) takes well under a second even across a
    /// 16384-voxel scene; thirty seconds leaves a slow strategy of the user's a wide margin and still ends a hung CI
    /// job within a minute.
    /// </summary>
    public const double DefaultSeconds = 30;

    private readonly Option<string?> _option = new("--tile-limit")
    {
        Description = $"Seconds one 16×16 tile of one strategy may take before the trace stops as hung (a strategy's loop that never ends); 0 turns the check off (default {DefaultSeconds.ToString(CultureInfo.InvariantCulture)}).",
    };

    public void AddTo(Command command) => command.Options.Add(_option);

    /// <summary>The watch the tracer reports tiles to, or null when the check is off.</summary>
    public TileWatch? Watch(ParseResult parse)
    {
        double seconds = DefaultSeconds;
        if (parse.GetValue(_option) is { } text
            && !(double.TryParse(text.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out seconds) && double.IsFinite(seconds) && seconds is >= 0 and <= 1e6))
            throw new InputException($"--tile-limit: '{MessageText.Excerpt(text)}' is not valid, expected seconds from 0 (no check) to 1000000, such as 30 or 2.5");
        return seconds == 0 || Debugger.IsAttached ? null : new TileWatch(TimeSpan.FromSeconds(seconds));
    }

    /// <summary>
    /// Checks <paramref name="watch"/> on a timer (every second, or twice per limit when that is shorter) until
    /// disposed, and calls <paramref name="stalled"/> once, on the timer's thread, for the first stall it sees.
    /// </summary>
    public static IDisposable Guard(TileWatch? watch, Action<TileStall> stalled)
    {
        if (watch is null)
            return new Timer(_ => { });
        int fired = 0;
        TimeSpan period = TimeSpan.FromTicks(Math.Min(TimeSpan.TicksPerSecond, Math.Max(TimeSpan.TicksPerMillisecond * 10, watch.Limit.Ticks / 2)));
        return new Timer(_ =>
        {
            if (watch.Check() is { } stall && Interlocked.Exchange(ref fired, 1) == 0)
                stalled(stall);
        }, null, period, period);
    }

    /// <summary>
    /// What a command does on a stall: the hung tile never returns, so the timer thread ends the run. A progress line
    /// stays above (where it stopped), then one line; <paramref name="discard"/> throws the unfinished output away.
    /// </summary>
    public static Action<TileStall> Ender(TextWriter error, bool afterProgress, Action? discard, Action<int> exit) => stall =>
    {
        if (afterProgress)
            error.WriteLine();
        var (line, code) = Report(stall);
        error.WriteLine(line);
        error.Flush();
        discard?.Invoke();
        exit(code);
    };

    /// <summary>
    /// The line a stall is reported with, and the exit code: a strategy of the user's is bad input, naming its file;
    /// a built-in one that hangs is a bug of VoxProf.
    /// </summary>
    public static (string Line, int Code) Report(TileStall stall) => stall.Strategy.Source is { } source
        ? ($"voxprof: error: {MessageText.ForDisplay($"{source}: {stall.Describe()}; does every step of its loop advance the ray? (--tile-limit SECONDS allows slower tiles, 0 turns this check off)")}",
            ExitCodes.BadInput)
        : ($"voxprof: internal error: {stall.Describe()}", ExitCodes.InternalError);
}
