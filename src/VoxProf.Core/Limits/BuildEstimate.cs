using System.Globalization;
using VoxProf.Core.Scenes;

namespace VoxProf.Core.Limits;

/// <summary>
/// What building a scene's tree will cost, from its layers' own estimates (<see cref="Layer.Cost"/>): the work in
/// voxel evaluations and the memory of the tree while it is built.
/// </summary>
public sealed class BuildEstimate
{
    /// <summary>
    /// The default work limit, in voxel evaluations: about 100 s of one core at the rate measured in
    /// docs/performance.md, 10 times the largest benchmark scene (an 8192² terrain, about 2e9).
    /// </summary>
    public const double DefaultMaxWork = 2e10;

    // Tree bytes per surface voxel: the sample terrain and sphere trees hold about 4 (N = 4), 8 (N = 2) and 8 (N = 8); while
    // building, each subtree sits in its own buffer before it is copied into place, about three times the tree
    // (docs/performance.md, "Tree build").
    private const double BuildPeakFactor = 3;

    private BuildEstimate(Scene scene, IReadOnlyList<LayerCost> layers, int branching)
    {
        Scene = scene;
        Layers = layers;
        Work = layers.Sum(c => c.Work);
        // An 8³ tree is regrouped from an octree built first, so its peak is the octree's build plus the 8³ tree
        // itself, about 8 bytes per surface voxel on the demo (45 MB against the 4³ tree's 23 MB).
        double peakPerSurface = branching switch
        {
            2 => 8 * BuildPeakFactor,
            8 => 8 * BuildPeakFactor + 8,
            _ => 4 * BuildPeakFactor,
        };
        TreeBytes = layers.Sum(c => c.Surface) * peakPerSurface;
        DataBytes = layers.Sum(c => c.DataBytes);
    }

    public Scene Scene { get; }

    /// <summary>Each layer's estimate, in scene order.</summary>
    public IReadOnlyList<LayerCost> Layers { get; }

    /// <summary>Voxel evaluations to build the tree, summed over the layers.</summary>
    public double Work { get; }

    /// <summary>Peak memory of the tree while it is built.</summary>
    public double TreeBytes { get; }

    /// <summary>Memory the layers allocate during the build (terrain heights).</summary>
    public double DataBytes { get; }

    public static BuildEstimate Of(Scene scene, int branching) =>
        new(scene, scene.Layers.Select(l => l.Cost(scene.Bounds)).ToArray(), branching);

    /// <summary>
    /// Throws a <see cref="LimitException"/> when the work is over <paramref name="maxWork"/>, naming the file, the
    /// layer that costs most (its JSON path) and how its cost was reckoned.
    /// </summary>
    public void RequireWork(double maxWork)
    {
        if (Work <= maxWork)
            return;
        int worst = 0;
        for (int i = 1; i < Layers.Count; i++)
        {
            if (Layers[i].Work > Layers[worst].Work)
                worst = i;
        }
        LayerCost cost = Layers[worst];
        Layer layer = Scene.Layers[worst];
        string label = layer.Label is { } l ? $" \"{MessageText.Excerpt(l)}\"" : "";
        string share = Layers.Count > 1 ? $", {LayerCost.Figure(cost.Work)} of them for this {layer.Kind} layer{label}" : $" for this {layer.Kind} layer{label}";
        throw new LimitException(LimitKind.Work, string.Create(CultureInfo.InvariantCulture,
            $"{Scene.SourcePath ?? Scene.Name}: $.layers[{worst}]: building the tree takes about {LayerCost.Figure(Work)} voxel evaluations{share} ({cost.Basis}), over the work limit of {LayerCost.Figure(maxWork)}"));
    }

    /// <summary>The build's memory parts, for <see cref="MemoryNeed.Require"/>.</summary>
    public IEnumerable<MemoryPart> MemoryParts()
    {
        yield return new MemoryPart("the tree while it is built", TreeBytes);
        if (DataBytes > 0)
            yield return new MemoryPart("terrain heights", DataBytes);
    }
}
