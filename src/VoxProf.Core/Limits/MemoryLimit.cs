using System.Globalization;

namespace VoxProf.Core.Limits;

/// <summary>Memory a run may use, and where the figure came from (named in refusals).</summary>
public sealed record MemoryLimit(long Bytes, string Source)
{
    /// <summary>
    /// What this process may allocate now: the smaller of the runtime's limit for its heap
    /// (<see cref="GCMemoryInfo.TotalAvailableMemoryBytes"/>: physical memory, or a container's limit) and, on Linux,
    /// <c>MemAvailable</c> in /proc/meminfo (memory free or reclaimable without swapping), plus what this process
    /// already holds, which it may reuse.
    /// </summary>
    public static MemoryLimit Probe()
    {
        long runtime = GC.GetGCMemoryInfo().TotalAvailableMemoryBytes;
        var best = new MemoryLimit(runtime, "the runtime's memory limit (physical memory or the container's limit)");
        if (MemAvailable() is { } available)
        {
            long usable = available + GC.GetTotalMemory(forceFullCollection: false);
            if (usable < best.Bytes)
                best = new MemoryLimit(usable, "MemAvailable in /proc/meminfo");
        }
        return best;
    }

    /// <summary>"22.4 GB" (decimal gigabytes, or MB below one).</summary>
    public static string Format(double bytes) =>
        bytes >= 1e9
            ? (bytes / 1e9).ToString("0.0", CultureInfo.InvariantCulture) + " GB"
            : Math.Max(1, Math.Round(bytes / 1e6)).ToString("0", CultureInfo.InvariantCulture) + " MB";

    private static long? MemAvailable()
    {
        try
        {
            if (!File.Exists("/proc/meminfo"))
                return null;
            foreach (string line in File.ReadLines("/proc/meminfo"))
            {
                if (!line.StartsWith("MemAvailable:", StringComparison.Ordinal))
                    continue;
                string[] parts = line.Split(' ', StringSplitOptions.RemoveEmptyEntries);
                return parts.Length >= 2 && long.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out long kb)
                    ? kb * 1024
                    : null;
            }
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // No figure from the kernel: the runtime's limit stands.
        }
        return null;
    }
}
