namespace VoxProf.Core.Trees.Building;

/// <summary>An append-only array that knows the global index of its first element.</summary>
internal sealed class GrowBuffer<T> where T : struct
{
    private T[] _items = new T[256];

    public int Count { get; private set; }

    /// <summary>Global index of element 0, so appended records can point at their final place.</summary>
    public int IndexBase { get; private set; }

    public void Reset(int indexBase)
    {
        Count = 0;
        IndexBase = indexBase;
    }

    /// <summary>Appends and returns the global index of the first appended element.</summary>
    public int Append(ReadOnlySpan<T> items)
    {
        if (Count + items.Length > _items.Length)
            Array.Resize(ref _items, Math.Max(_items.Length * 2, Count + items.Length));
        items.CopyTo(_items.AsSpan(Count));
        int first = IndexBase + Count;
        Count += items.Length;
        return first;
    }

    public ReadOnlySpan<T> Span => _items.AsSpan(0, Count);

    public T[] ToArray() => Span.ToArray();
}
