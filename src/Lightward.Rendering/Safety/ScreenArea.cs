namespace Lightward.Rendering.Safety;

/// <summary>
/// How much of the viewer's screen each analysis cell covers, as shares summing to 1. On a flat screen every cell is
/// equal; on a dome the share is the cell's solid angle, so a flash near the springline counts for what it covers.
/// </summary>
public static class ScreenArea
{
    private const int Samples = 8;

    public static float[] Uniform(int gridWidth, int gridHeight) => Normalised(gridWidth, gridHeight, (_, _) => 1);

    /// <summary>
    /// A domemaster (azimuthal equidistant fisheye, zenith at the centre, <paramref name="domeAngle"/> across the
    /// inscribed circle). In that projection θ = r·domeAngle/2, so the solid angle per unit image area is ∝ sin θ / θ.
    /// Corners outside the circle are not screen at all.
    /// </summary>
    public static float[] Domemaster(int gridSize, double domeAngle) => Normalised(gridSize, gridSize, (u, v) =>
    {
        double r = Math.Sqrt(u * u + v * v);
        if (r > 1) return 0;
        double theta = r * domeAngle / 2;
        return theta < 1e-9 ? 1 : Math.Sin(theta) / theta;
    });

    /// <summary>An equirectangular frame: solid angle per unit area ∝ cos(latitude), latitude = −v·90°.</summary>
    public static float[] Equirectangular(int gridWidth, int gridHeight) => Normalised(gridWidth, gridHeight, (_, v) => Math.Cos(v * Math.PI / 2));

    /// <summary>Integrates <paramref name="density"/> over each cell with a fixed grid of samples; u, v run from −1 to 1, v downwards.</summary>
    private static float[] Normalised(int gridWidth, int gridHeight, Func<double, double, double> density)
    {
        var area = new double[gridWidth * gridHeight];
        double total = 0;
        for (int row = 0; row < gridHeight; row++)
            for (int column = 0; column < gridWidth; column++)
            {
                double sum = 0;
                for (int sy = 0; sy < Samples; sy++)
                    for (int sx = 0; sx < Samples; sx++)
                    {
                        double u = -1 + 2 * (column + (sx + 0.5) / Samples) / gridWidth;
                        double v = -1 + 2 * (row + (sy + 0.5) / Samples) / gridHeight;
                        sum += density(u, v);
                    }
                area[row * gridWidth + column] = sum;
                total += sum;
            }
        return area.Select(a => (float)(a / total)).ToArray();
    }
}
