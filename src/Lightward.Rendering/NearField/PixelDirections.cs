using Lightward.Rendering.Projections;

namespace Lightward.Rendering.NearField;

/// <summary>
/// The camera-axes direction through every pixel centre of one projection, computed once and reused every frame:
/// the mapping depends only on the projection, never on the ship's state. NaN where the image shows no direction.
/// </summary>
public sealed class PixelDirections
{
    public PixelDirections(Projection projection)
    {
        Projection = projection;
        int count = projection.Width * projection.Height;
        X = new float[count];
        Y = new float[count];
        Z = new float[count];
        Parallel.For(0, projection.Height, row =>
        {
            int start = row * projection.Width;
            projection.UnprojectRow(row, X.AsSpan(start, projection.Width), Y.AsSpan(start, projection.Width), Z.AsSpan(start, projection.Width));
        });
        HasBlankPixels = Array.Exists(X, float.IsNaN);
    }

    /// <summary>True when some pixels show no direction (outside a dome's disc), so drawing must check each pixel.</summary>
    public bool HasBlankPixels { get; }

    public Projection Projection { get; }
    public float[] X { get; }
    public float[] Y { get; }
    public float[] Z { get; }
}
