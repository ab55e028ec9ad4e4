using System.Globalization;

namespace VoxProf.Core.Limits;

/// <summary>One part of a run's memory estimate ("results of 5 strategies at 16384×16384": 91 GB).</summary>
public readonly record struct MemoryPart(string What, double Bytes);

/// <summary>A run's memory estimate, part by part, checked against a <see cref="MemoryLimit"/> before the run starts.</summary>
public static class MemoryNeed
{
    /// <summary>Throws a <see cref="LimitException"/> naming the total, its largest parts and the limit when the parts do not fit.</summary>
    public static void Require(string run, IReadOnlyList<MemoryPart> parts, MemoryLimit limit)
    {
        double total = parts.Sum(p => p.Bytes);
        if (total <= limit.Bytes)
            return;
        string detail = string.Join(", ", parts.Where(p => p.Bytes >= 0.05 * total).OrderByDescending(p => p.Bytes)
            .Select(p => $"{p.What} {MemoryLimit.Format(p.Bytes)}"));
        throw new LimitException(LimitKind.Memory, string.Create(CultureInfo.InvariantCulture,
            $"{run} needs about {MemoryLimit.Format(total)} of memory ({detail}), more than the {MemoryLimit.Format(limit.Bytes)} available ({limit.Source})"));
    }
}
