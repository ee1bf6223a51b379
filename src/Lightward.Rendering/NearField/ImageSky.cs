using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Which pixels of a projection show the sky, and the cone that holds them, found once per projection from its own
/// row unprojection: the mapping depends only on the projection, never on the ship's state. Every projection here
/// shows the sky over one unbroken run of each row (a dome's disc meets a row in one chord), so a row is described
/// by its first and last such column; the directions themselves are worked out where they are needed, band by band,
/// since a frame-sized table of them would be read from main memory.
/// </summary>
public sealed class ImageSky
{
    private readonly int[] _firstColumn, _lastColumn;

    public ImageSky(Projection projection)
    {
        Projection = projection;
        int width = projection.Width, height = projection.Height;
        _firstColumn = new int[height];
        _lastColumn = new int[height];
        float[] x = new float[width], y = new float[width], z = new float[width];
        for (int row = 0; row < height; row++)
        {
            projection.UnprojectRow(row, 0, x, y, z);
            int first = Array.FindIndex(x, v => !float.IsNaN(v)), last = Array.FindLastIndex(x, v => !float.IsNaN(v));
            if (first >= 0 && Array.FindIndex(x, first, last - first + 1, float.IsNaN) >= 0)
                throw new ArgumentException($"row {row} of the projection shows the sky in more than one run", nameof(projection));
            (_firstColumn[row], _lastColumn[row]) = first >= 0 ? (first, last) : (width, -1);
            HasBlankPixels |= first != 0 || last != width - 1;
        }
        View = Cone(projection, x, y, z);
    }

    public Projection Projection { get; }

    /// <summary>True when some pixels show no direction (outside a dome's disc), so drawing must check each pixel.</summary>
    public bool HasBlankPixels { get; }

    /// <summary>The smallest cone around the image's central direction that holds every pixel's direction.</summary>
    public ViewCap View { get; }

    /// <summary>The columns of row <paramref name="row"/> that show the sky: [first, last], empty when first &gt; last.</summary>
    public (int First, int Last) SkyColumns(int row) => (_firstColumn[row], _lastColumn[row]);

    /// <summary>Centred on the middle pixel, reaching the farthest pixel (using <paramref name="x"/>… as a row buffer).</summary>
    private static ViewCap Cone(Projection projection, float[] x, float[] y, float[] z)
    {
        int width = projection.Width, height = projection.Height;
        projection.UnprojectRow(height / 2, 0, x, y, z);
        Vec3 centre = new Vec3(x[width / 2], y[width / 2], z[width / 2]).NormalizedOr(Vec3.UnitZ);
        double radius = 0;
        // The farthest pixel lies on the image's border or on the edge of a dome's disc; a stride of 2 misses at most a pixel's angle.
        for (int row = 0; row < height; row += 2)
        {
            projection.UnprojectRow(row, 0, x, y, z);
            for (int column = 0; column < width; column += 2)
                if (!float.IsNaN(x[column])) radius = Math.Max(radius, Vec3.AngleBetween(centre, new Vec3(x[column], y[column], z[column])));
        }
        return new ViewCap(centre, Math.Min(Math.PI, radius + 0.01));
    }
}
