namespace VoxProf.Core.Trees;

/// <summary>Cold facts about a built tree, for inspect output and reports.</summary>
public sealed record TreeStats(
    int Branching,
    int Depth,
    int RootSize,
    long[] NodesPerLevel,
    long[] SolidCellsPerLevel,
    long[] BytesPerLevel,
    long SolidVoxels,
    long TotalBytes,
    TimeSpan BuildTime)
{
    public long NodeCount => NodesPerLevel.Sum();

    public double BytesPerSolidVoxel => SolidVoxels == 0 ? 0 : (double)TotalBytes / SolidVoxels;
}
