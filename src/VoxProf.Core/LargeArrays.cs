using System.Runtime.InteropServices;

namespace VoxProf.Core;

/// <summary>
/// Arrays of hundreds of megabytes that are written once from end to end: the raw scene's voxel mask and the
/// per-pixel result buffers. On Linux their memory is offered to the kernel's transparent huge pages
/// (<c>madvise(MADV_HUGEPAGE)</c>, which a system in the common "madvise" mode needs before it backs a range with
/// 2 MiB pages), so the first write faults once per 2 MiB instead of once per 4 KiB page. A profile of
/// <c>trace --strategy dda-mask --size 2560x1440</c> on a 256 MiB raw scene had 18% of the process in page faults,
/// two thirds of it the fault itself rather than clearing the page (docs/performance.md). Elsewhere, or when the
/// kernel refuses, the array is an ordinary one: the advice changes no value, only how the memory is mapped.
/// </summary>
public static class LargeArrays
{
    /// <summary>Below this, advice is not worth a system call (and the array may not hold one whole 2 MiB page).</summary>
    private const long MinBytes = 8L << 20;

    private const long HugePage = 2L << 20;

    private const int AdviseHugePage = 14;

    /// <summary>
    /// An array of <paramref name="length"/> elements whose contents are not cleared: the caller writes every element
    /// before reading it. Pinned (never moved by the collector), so the advice stays with its memory.
    /// </summary>
    public static T[] Uninitialized<T>(int length) where T : unmanaged
    {
        long bytes = (long)length * Marshal.SizeOf<T>();
        if (bytes < MinBytes || !OperatingSystem.IsLinux())
            return GC.AllocateUninitializedArray<T>(length);
        T[] array = GC.AllocateUninitializedArray<T>(length, pinned: true);
        Advise(Marshal.UnsafeAddrOfPinnedArrayElement(array, 0), bytes);
        return array;
    }

    /// <summary>
    /// As <see cref="Uninitialized{T}"/>, cleared: for arrays read at random for the whole run (the tree's node
    /// records), where 2 MiB pages also spare the processor's address translation a miss on most reads.
    /// </summary>
    public static T[] Zeroed<T>(int length) where T : unmanaged
    {
        T[] array = Uninitialized<T>(length);
        Array.Clear(array);
        return array;
    }

    /// <summary>The whole 2 MiB pages inside [start, start + bytes): the kernel backs only aligned huge pages.</summary>
    private static void Advise(nint start, long bytes)
    {
        long first = (start + HugePage - 1) & ~(HugePage - 1);
        long end = (start + bytes) & ~(HugePage - 1);
        if (end <= first)
            return;
        try
        {
            // A refusal (an old kernel, huge pages off) leaves ordinary pages; nothing depends on the result.
            _ = MAdvise((nint)first, (nuint)(end - first), AdviseHugePage);
        }
        catch (Exception ex) when (ex is EntryPointNotFoundException or DllNotFoundException)
        {
        }
    }

    [DllImport("libc", EntryPoint = "madvise")]
    private static extern int MAdvise(nint address, nuint length, int advice);
}
