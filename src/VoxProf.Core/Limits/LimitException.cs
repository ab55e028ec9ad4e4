namespace VoxProf.Core.Limits;

/// <summary>Which limit a run would exceed.</summary>
public enum LimitKind
{
    /// <summary>The estimated work (voxel evaluations or grid steps) is over the work limit.</summary>
    Work,

    /// <summary>The estimated memory is over what the machine has available.</summary>
    Memory,
}

/// <summary>
/// A run refused before it starts because its estimate exceeds a limit; the message names the layer or the part
/// of the run, the estimate and the limit. The command line adds how to raise the limit.
/// </summary>
public sealed class LimitException : InputException
{
    public LimitException(LimitKind kind, string message) : base(message) => Kind = kind;

    public LimitKind Kind { get; }
}
