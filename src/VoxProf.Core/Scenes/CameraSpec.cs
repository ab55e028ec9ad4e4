using System.Numerics;

namespace VoxProf.Core.Scenes;

/// <summary>A named pinhole camera as written in a scene file, in voxel units (y up).</summary>
public sealed record CameraSpec(string Name, Vector3 Eye, Vector3 Target, Vector3 Up, float FovYDegrees);
