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
        Vec3 centre = MiddleDirection(projection);
        // Per row, the largest squared chord from the centre to a pixel's direction (every other row and column).
        var farthest = new double[height];
        Parallel.For(0, height, () => new RowBuffer(width), (row, _, buffer) =>
        {
            projection.UnprojectRow(row, 0, buffer.X, buffer.Y, buffer.Z);
            (_firstColumn[row], _lastColumn[row]) = SkyRun(buffer.X);
            if (row % 2 == 0) farthest[row] = FarthestChordSquared(centre, buffer);
            return buffer;
        }, _ => { });
        for (int row = 0; row < height; row++)
        {
            if (_lastColumn[row] == int.MinValue)
                throw new ArgumentException($"row {row} of the projection shows the sky in more than one run", nameof(projection));
            HasBlankPixels |= _firstColumn[row] != 0 || _lastColumn[row] != width - 1;
        }
        // The farthest pixel lies on the image's border or on the edge of a dome's disc; a stride of 2 misses at most a
        // pixel's angle. A chord c spans the angle 2 asin(c/2), well conditioned for the narrowest scope views too.
        double radius = 2 * Math.Asin(Math.Min(1, Math.Sqrt(farthest.Max()) / 2));
        View = new ViewCap(centre, Math.Min(Math.PI, radius + 0.01));
    }

    public Projection Projection { get; }

    /// <summary>True when some pixels show no direction (outside a dome's disc), so drawing must check each pixel.</summary>
    public bool HasBlankPixels { get; }

    /// <summary>The smallest cone around the image's central direction that holds every pixel's direction.</summary>
    public ViewCap View { get; }

    /// <summary>The columns of row <paramref name="row"/> that show the sky: [first, last], empty when first &gt; last.</summary>
    public (int First, int Last) SkyColumns(int row) => (_firstColumn[row], _lastColumn[row]);

    private sealed class RowBuffer(int width)
    {
        public readonly float[] X = new float[width], Y = new float[width], Z = new float[width];
    }

    /// <summary>The direction through the middle pixel, the cone's axis.</summary>
    private static Vec3 MiddleDirection(Projection projection)
    {
        var buffer = new RowBuffer(projection.Width);
        projection.UnprojectRow(projection.Height / 2, 0, buffer.X, buffer.Y, buffer.Z);
        int middle = projection.Width / 2;
        return new Vec3(buffer.X[middle], buffer.Y[middle], buffer.Z[middle]).NormalizedOr(Vec3.UnitZ);
    }

    /// <summary>First and last columns whose direction exists (not NaN); (width, −1) when none does, last = int.MinValue when they are not one run.</summary>
    private static (int First, int Last) SkyRun(ReadOnlySpan<float> x)
    {
        int first = 0, last = x.Length - 1;
        while (first < x.Length && float.IsNaN(x[first])) first++;
        if (first == x.Length) return (x.Length, -1);
        while (float.IsNaN(x[last])) last--;
        for (int column = first; column <= last; column++)
            if (float.IsNaN(x[column])) return (first, int.MinValue);
        return (first, last);
    }

    /// <summary>The largest squared chord between <paramref name="centre"/> and the directions in the even columns of a row.</summary>
    private static double FarthestChordSquared(Vec3 centre, RowBuffer row)
    {
        double farthest = 0;
        for (int column = 0; column < row.X.Length; column += 2)
        {
            if (float.IsNaN(row.X[column])) continue;
            double dx = row.X[column] - centre.X, dy = row.Y[column] - centre.Y, dz = row.Z[column] - centre.Z;
            farthest = Math.Max(farthest, dx * dx + dy * dy + dz * dz);
        }
        return farthest;
    }
}
