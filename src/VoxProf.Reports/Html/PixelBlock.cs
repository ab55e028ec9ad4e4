using VoxProf.Core.Traversal;
using VoxProf.Reports.Pixels;

namespace VoxProf.Reports.Html;

/// <summary>
/// The data report.html's readout reads: a JSON block (<c>#vp-data</c>) that names the counters, the hit planes, the
/// face names and, per strategy, which base64 block holds its counters and which its hits; then one
/// <c>&lt;script type="application/octet-stream"&gt;</c> block per strategy (<see cref="PixelPack"/>). The hit planes
/// (t above all) are most of the bytes, and strategies nearly always agree on them, so a strategy whose hits equal an
/// earlier one's refers to that copy, and any other strategy after the first stores its hit planes as differences
/// from the first strategy's: near zero everywhere (t differs in the last bits between strategies), so they deflate
/// to little.
/// </summary>
public sealed class PixelBlock
{
    private PixelBlock(PageData data, IReadOnlyList<(string Id, byte[] Packed)> blobs)
    {
        Data = data;
        Blobs = blobs;
    }

    public PageData Data { get; }

    public IReadOnlyList<(string Id, byte[] Packed)> Blobs { get; }

    /// <summary>Base64 characters embedded, over all blocks.</summary>
    public long EmbeddedChars => Blobs.Sum(b => (b.Packed.Length + 2L) / 3 * 4);

    public static PixelBlock Build(TraceRun run)
    {
        var data = run.Results.Select(PixelData.From).ToArray();
        var entries = new StrategyEntry[data.Length];
        var hitPlanes = new List<int[]>?[data.Length];
        var owners = new List<(PixelHit[] Hits, string Id)>();
        for (int i = 0; i < data.Length; i++)
        {
            string id = BlobId(i);
            string? owner = owners.FirstOrDefault(o => PixelPack.SameHits(o.Hits, data[i].Hits)).Id;
            entries[i] = new StrategyEntry(data[i].Strategy, id, owner ?? id, owner is null && i > 0 ? BlobId(0) : null);
            if (owner is null)
                owners.Add((data[i].Hits, id));
        }
        // One counter list for the page: every strategy's planes follow it, a counter of another strategy's own as zeros.
        string[] counters = [.. CounterNames.All.Select(c => c.Name()).Concat(data.SelectMany(d => d.CounterNames)).Distinct(StringComparer.OrdinalIgnoreCase)];
        // Packing is independent per strategy and deflate is the slow part: one strategy per core.
        PixelHit[] first = data.Length > 0 ? data[0].Hits : [];
        var blobs = new (string Id, byte[] Packed)[data.Length];
        Parallel.For(0, data.Length, i => blobs[i] = (entries[i].Blob, PixelPack.Encode(Planes(data[i], counters, entries[i], first))));
        var faces = Enumerable.Range(0, 7).Select(f => PixelHit.FaceName((HitFace)f)).ToArray();
        var page = new PageData(run.Settings.Width, run.Settings.Height, counters, [.. PixelPack.HitPlanes], faces, entries);
        return new PixelBlock(page, blobs);
    }

    private static string BlobId(int index) => $"vp-px-{index}";

    /// <summary>
    /// One strategy's planes, each filled into the same buffer when the packer asks for it: the packer has consumed a
    /// plane before it asks for the next, and a full-size page then costs one plane of memory per strategy, not
    /// eighteen of garbage. The first strategy's hit plane a difference is taken from is filled the same way, one plane
    /// at a time and only when some strategy needs it (a profile at 2560×1440 showed all seven planes of it, 100 MB
    /// of fresh memory, built even for a single strategy).
    /// </summary>
    private static IEnumerable<int[]> Planes(PixelData data, string[] counters, StrategyEntry entry, PixelHit[] first)
    {
        var buffer = new int[data.Width * data.Height];
        foreach (string name in counters)
        {
            if (data.Find(name) is { } counter)
            {
                for (int i = 0; i < buffer.Length; i++)
                    buffer[i] = unchecked((int)counter[i]);
            }
            else
                Array.Clear(buffer);
            yield return buffer;
        }
        if (entry.Hits != entry.Blob)
            yield break;
        int[]? firstPlane = entry.HitsRelativeTo is not null ? new int[buffer.Length] : null;
        for (int p = 0; p < PixelPack.HitPlanes.Count; p++)
        {
            PixelPack.HitPlane(data.Hits, p, buffer);
            if (firstPlane is not null)
            {
                PixelPack.HitPlane(first, p, firstPlane);
                for (int i = 0; i < buffer.Length; i++)
                    buffer[i] = unchecked(buffer[i] - firstPlane[i]);
            }
            yield return buffer;
        }
    }

    public void Write(TextWriter w)
    {
        w.Write("<script type=\"application/json\" id=\"vp-data\">");
        w.Write(HtmlText.JsonData(Data));
        w.Write("</script>\n");
        foreach (var (id, packed) in Blobs)
        {
            w.Write($"<script type=\"application/octet-stream\" id=\"{id}\">");
            w.Write(Convert.ToBase64String(packed));
            w.Write("</script>\n");
        }
    }

    /// <param name="Blob">Id of the block with this strategy's counters.</param>
    /// <param name="Hits">Id of the block whose hit planes this strategy's hits are (its own, or an earlier identical one).</param>
    /// <param name="HitsRelativeTo">When the hit planes of <paramref name="Blob"/> are differences, the block they are added to.</param>
    public sealed record StrategyEntry(string Name, string Blob, string Hits, string? HitsRelativeTo);

    /// <param name="Faces">Entry face names by code (0 = inside the voxel at t = 0).</param>
    public sealed record PageData(int Width, int Height, string[] Counters, string[] HitPlanes, string[] Faces, IReadOnlyList<StrategyEntry> Strategies);
}
