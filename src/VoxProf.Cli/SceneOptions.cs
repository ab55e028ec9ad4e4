using System.CommandLine;
using System.Globalization;
using VoxProf.Core;
using VoxProf.Core.Limits;
using VoxProf.Core.Scenes;

namespace VoxProf.Cli;

/// <summary>Options every command that loads a scene shares: the work limit and the confinement of the files it names.</summary>
internal sealed class SceneOptions
{
    private readonly Option<string?> _maxWork = new("--max-work")
    {
        Description = $"Refuse a run whose estimated work exceeds this many voxel evaluations or grid steps " +
            $"(default {BuildEstimate.DefaultMaxWork.ToString("0e0", CultureInfo.InvariantCulture)}, about 100 s of one core).",
    };

    private readonly Option<bool> _confineFiles = new("--confine-files")
    {
        Description = "Refuse raw, mesh and heightmap files outside the scene file's folder (symbolic links followed): for scenes you do not trust.",
    };

    public void AddTo(Command command)
    {
        command.Options.Add(_maxWork);
        command.Options.Add(_confineFiles);
    }

    /// <summary>--max-work as a number of evaluations: a positive finite number, "2e10" or "20000000000".</summary>
    public double MaxWork(ParseResult parse)
    {
        if (parse.GetValue(_maxWork) is not { } text)
            return BuildEstimate.DefaultMaxWork;
        if (double.TryParse(text.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out double v) && double.IsFinite(v) && v > 0)
            return v;
        throw new InputException($"--max-work: '{MessageText.Excerpt(text)}' is not valid, expected a positive number of voxel evaluations such as 2e10");
    }

    public SceneLoadOptions LoadOptions(ParseResult parse) => new() { ConfineFiles = parse.GetValue(_confineFiles) };

    /// <summary>What to do about a refused estimate, added to its message.</summary>
    public static string Hint(LimitKind kind) => kind == LimitKind.Work
        ? "; raise the limit with --max-work if the run should go ahead"
        : "; trace a smaller --size or fewer strategies, or simplify the scene";
}
