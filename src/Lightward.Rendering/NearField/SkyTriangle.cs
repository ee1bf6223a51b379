using System.Numerics;

namespace Lightward.Rendering.NearField;

/// <summary>
/// One triangle as it appears on the sky: the unit directions (camera axes) in which its corners are seen, the
/// distance of each corner's emission event (observer's frame; smaller is nearer) and its colour there (linear sRGB
/// radiance, premultiplied by nothing). Its sides are great-circle arcs between the corner directions; callers keep
/// triangles small enough that the true, curved image of each side stays within half a pixel of that arc.
/// </summary>
public struct SkyTriangle
{
    public Vector3 DirectionA, DirectionB, DirectionC;
    public float DepthA, DepthB, DepthC;
    public Vector3 ColourA, ColourB, ColourC;
    /// <summary>Bit 0: side A→B, bit 1: B→C, bit 2: C→A lies on the body's outline and is drawn with a soft, half-pixel ramp.</summary>
    public byte OutlineSides;
}
