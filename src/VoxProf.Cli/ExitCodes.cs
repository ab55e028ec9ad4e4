namespace VoxProf.Cli;

/// <summary>Documented in the README; CI jobs depend on these numbers.</summary>
public static class ExitCodes
{
    public const int Ok = 0;
    /// <summary>compare: at least one gate rule is broken.</summary>
    public const int RuleBroken = 1;
    /// <summary>Bad usage or bad input: an option, a scene, a report, an output directory.</summary>
    public const int BadInput = 2;
    /// <summary>A bug: an unexpected exception (message printed, no stack trace unless VOXPROF_DEBUG is set).</summary>
    public const int InternalError = 70;
}
