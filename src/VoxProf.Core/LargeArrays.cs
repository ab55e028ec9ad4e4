using System.Runtime.CompilerServices;
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
    /// <paramref name="count"/> arrays of <paramref name="length"/> uncleared elements, allocated one after another and
    /// offered to huge pages together (the per-pixel buffers of a trace). An array alone often holds no whole aligned
    /// 2 MiB page (a counter buffer at 1280×720 is 3.7 MB), and the collector writes each array's header as it
    /// allocates it, after which the 2 MiB range holding that header is backed by small pages. So the range the run
    /// will take is advised before the arrays are allocated, and they then fall into it: the collector places large
    /// arrays allocated in a row next to each other. Where it does not, the arrays are ordinary ones, as elsewhere than
    /// Linux; the values are the same either way. Measured: 9 buffers of 3.7 MB took 8,100–8,300 page faults to clear;
    /// advised ahead, 600–1,140 (docs/performance.md).
    /// </summary>
    public static unsafe T[][] Run<T>(int count, int length, bool pinned) where T : unmanaged
    {
        var arrays = new T[count][];
        long bytes = (long)length * sizeof(T);
        if (count * bytes >= MinBytes && OperatingSystem.IsLinux())
        {
            // A 2 MiB anchor takes the run's first touched page (its header) and the range the run will take is advised
            // behind it. The anchor can land in a gap the run does not fit, though; then the range is advised from the
            // first array instead, whose own header then costs one 2 MiB range of small pages.
            byte[] anchor = GC.AllocateUninitializedArray<byte>((int)HugePage, pinned);
            nint at = AddressOf(anchor);
            // The anchor, the run, and 2 MiB of slack for the headers and alignment between the arrays.
            Advise(at, HugePage + count * bytes + HugePage);
            arrays[0] = GC.AllocateUninitializedArray<T>(length, pinned);
            nint first = AddressOf(arrays[0]);
            if (first < at || first > at + 2 * HugePage)
                Advise(first, count * bytes + HugePage);
            for (int i = 1; i < count; i++)
            {
                arrays[i] = GC.AllocateUninitializedArray<T>(length, pinned);
                // A run longer than the collector's region for large objects continues elsewhere, outside the range
                // advised ahead: there each array is advised alone, as Uninitialized does.
                if (bytes >= MinBytes)
                    Advise(AddressOf(arrays[i]), bytes);
            }
            // Alive until the run is placed: a collection freeing it would leave a gap the next array could take.
            GC.KeepAlive(anchor);
            return arrays;
        }
        for (int i = 0; i < count; i++)
            arrays[i] = GC.AllocateUninitializedArray<T>(length, pinned);
        return arrays;
    }

    /// <summary>Where an array's elements start. Large arrays are not moved unless a compaction is asked for, so the
    /// address holds long enough to advise.</summary>
    private static unsafe nint AddressOf<T>(T[] array) where T : unmanaged =>
        (nint)Unsafe.AsPointer(ref MemoryMarshal.GetArrayDataReference(array));

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
