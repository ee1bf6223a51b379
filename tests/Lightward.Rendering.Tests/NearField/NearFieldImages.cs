using Lightward.Rendering.NearField;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

/// <summary>Renders near-field scenes on a black sky and measures the pictures.</summary>
internal static class NearFieldImages
{
    public static HdrFrame Render(NearFieldLayer layer, Projection projection, ShipState ship, Rotation cameraToShip, int threads = -1) =>
        RenderWithGuides(layer, projection, ship, cameraToShip, threads).Light;

    /// <summary>The bodies' light and the grid's lines (display codes, drawn over the picture), rendered on a black sky.</summary>
    public static (HdrFrame Light, DisplayOverlay Guides) RenderWithGuides(NearFieldLayer layer, Projection projection, ShipState ship, Rotation cameraToShip, int threads = -1)
    {
        var frame = new HdrFrame(projection.Width, projection.Height);
        var guides = new DisplayOverlay(projection.Width, projection.Height);
        layer.Draw(frame, guides, projection, ship, cameraToShip, new ParallelOptions { MaxDegreeOfParallelism = threads });
        return (frame, guides);
    }

    /// <summary>A camera at the home origin at home time <paramref name="time"/>, at rest.</summary>
    public static ShipState ShipAtRest(double time = 0) => ShipState.AtRest(new FourVector(time, 0, 0, 0));

    /// <summary>Camera axes turned so that the view axis (+Z) points along <paramref name="direction"/> (ship axes).</summary>
    public static Rotation LookingAlong(Vec3 direction) => Rotation.Between(Vec3.UnitZ, direction.NormalizedOr(Vec3.UnitZ));

    /// <summary>A body in uniform motion that passes <paramref name="position"/> at home time <paramref name="time"/>.</summary>
    public static IWorldline Passing(Vec3 position, double time, Vec3 beta) =>
        new InertialWorldline(new FourVector(time, position), Velocity.FromBeta(beta));

    public static NearFieldLayer Layer(params NearFieldBody[] bodies) => new(bodies, grid: null);

    /// <summary>A body that glows with a fixed luminance (5000 cd/m², 6500 K), bright enough to measure.</summary>
    public static BodySurface Glow => new(SurfaceKind.Glowing, 6500, 5000, Vec3.UnitZ);

    /// <summary>Luminance-weighted image moments: area (pixels of full brightness), centroid and the axis ratio of the equivalent ellipse.</summary>
    public static (double Area, double CentreX, double CentreY, double AxisRatio) Moments(HdrFrame frame, Func<int, int, double> weight)
    {
        double sum = 0, sx = 0, sy = 0, sxx = 0, syy = 0, sxy = 0;
        for (int y = 0; y < frame.Height; y++)
            for (int x = 0; x < frame.Width; x++)
            {
                double w = weight(x, y);
                if (w <= 0) continue;
                double px = x + 0.5, py = y + 0.5;
                sum += w; sx += w * px; sy += w * py; sxx += w * px * px; syy += w * py * py; sxy += w * px * py;
            }
        double cx = sx / sum, cy = sy / sum;
        double vxx = sxx / sum - cx * cx, vyy = syy / sum - cy * cy, vxy = sxy / sum - cx * cy;
        // Eigenvalues of the 2×2 covariance: the squared semi-axes of the equivalent ellipse, up to a common factor.
        double mean = (vxx + vyy) / 2, spread = Math.Sqrt((vxx - vyy) * (vxx - vyy) / 4 + vxy * vxy);
        return (sum, cx, cy, Math.Sqrt((mean - spread) / (mean + spread)));
    }

    public static float MaxLuminance(HdrFrame frame)
    {
        float max = 0;
        for (int y = 0; y < frame.Height; y++)
            for (int x = 0; x < frame.Width; x++) max = Math.Max(max, frame.Luminance(x, y));
        return max;
    }
}
