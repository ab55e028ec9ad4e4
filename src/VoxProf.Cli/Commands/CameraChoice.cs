using System.Globalization;
using System.Numerics;
using VoxProf.Core;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Paths;

namespace VoxProf.Cli.Commands;

/// <summary>--camera, or a custom view from --eye/--target; --up and --fov adjust either.</summary>
internal sealed record CameraChoice(string? Name, string? Eye, string? Target, string? Up, float? Fov)
{
    public void Validate()
    {
        if (Name is not null && (Eye is not null || Target is not null))
            throw new InputException("--camera: give either --camera NAME or --eye and --target, not both");
        if ((Eye is null) != (Target is null))
            throw new InputException($"{(Eye is null ? "--eye" : "--target")}: missing; a custom camera needs both --eye and --target");
        if (Fov is { } f && !(f >= CameraChecks.MinFovDegrees && f <= CameraChecks.MaxFovDegrees))
            throw new InputException($"--fov: {f.ToString(CultureInfo.InvariantCulture)} is not valid, expected {CameraChecks.FovRange}");
        if (Eye is not null)
            OptionParsing.Vector(Eye, "--eye");
        if (Target is not null)
            OptionParsing.Vector(Target, "--target");
        if (Up is not null)
            OptionParsing.Vector(Up, "--up");
    }

    /// <summary>True when --camera asks for a run of several views whatever their number (all, or a list).</summary>
    public bool NamesSeveral => Name is { } n && (n.Contains(',', StringComparison.Ordinal) || string.Equals(n.Trim(), ViewSelection.All, StringComparison.OrdinalIgnoreCase));

    /// <summary>The views to trace: the custom camera, or the scene's views --camera names, each with --up and --fov applied.</summary>
    public IReadOnlyList<CameraSpec> ResolveAll(Scene scene)
    {
        Vector3? up = Up is null ? null : OptionParsing.Vector(Up, "--up");
        if (Eye is not null && Target is not null)
        {
            var custom = new CameraSpec("custom", OptionParsing.Vector(Eye, "--eye"), OptionParsing.Vector(Target, "--target"),
                up ?? Vector3.UnitY, Fov ?? TraceCommand.DefaultFov);
            Check(custom, up is null, "");
            return [custom];
        }
        IReadOnlyList<CameraSpec> chosen = Name is null ? ViewSelection.Default(scene) : ViewSelection.Resolve(scene, Name);
        var views = new List<CameraSpec>(chosen.Count);
        foreach (CameraSpec c in chosen)
        {
            CameraSpec adjusted = c with { Up = up ?? c.Up, FovYDegrees = Fov ?? c.FovYDegrees };
            // The scene loader checked the camera as written; --up can still turn it into one that looks along up.
            Check(adjusted, upIsDefault: false, $" (camera '{c.Name}' of {scene.SourcePath ?? scene.Name})");
            views.Add(adjusted);
        }
        return views;
    }

    /// <summary>The scene files' camera checks (<see cref="CameraChecks"/>), naming the option at fault.</summary>
    private void Check(CameraSpec camera, bool upIsDefault, string which)
    {
        if (CameraChecks.Check(camera.Eye, camera.Target, camera.Up, camera.FovYDegrees, upIsDefault) is not { } problem)
            return;
        string option = problem.Part switch
        {
            CameraPart.Up => $"--up {Up}",
            CameraPart.Fov => $"--fov {Fov?.ToString(CultureInfo.InvariantCulture)}",
            _ => Target is null ? "--camera" : $"--target {Target}",
        };
        throw new InputException($"{option}: {problem.Message}{which}");
    }
}
