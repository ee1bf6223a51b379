using System.Runtime.Intrinsics;

namespace Lightward.Rendering.NearField;

/// <summary>Lane numbers of a 256-bit vector of floats, for the drawing loops that handle eight neighbouring pixels at once.</summary>
internal static class VectorLanes
{
    public const int Count = 8;

    /// <summary>0, 1, …, 7: added to a first column, the column of each lane.</summary>
    public static readonly Vector256<int> Indices = Vector256.Create(0, 1, 2, 3, 4, 5, 6, 7);

    /// <summary>0.5, 1.5, …, 7.5: added to a first column, the centre of each lane's pixel.</summary>
    public static readonly Vector256<float> Centres = Vector256.Create(0.5f, 1.5f, 2.5f, 3.5f, 4.5f, 5.5f, 6.5f, 7.5f);
}
