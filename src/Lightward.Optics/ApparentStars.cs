namespace Lightward.Optics;

/// <summary>
/// The stars as light delivers them to the cockpit this frame, as flat arrays (structure of arrays) for the renderer's
/// hot loops. Directions point from the ship toward where each star appears, in ship axes (+Z forward, +X right,
/// +Y up). Colours are linear sRGB irradiance scaled so that photopic luminance Y = 0.2126 R + 0.7152 G + 0.0722 B
/// equals 10^(−0.4 m) for a star of apparent visual magnitude m (a V = 0 star has Y = 1).
/// </summary>
public sealed class ApparentStars
{
    public int Count { get; set; }
    public float[] X { get; private set; } = [];
    public float[] Y { get; private set; } = [];
    public float[] Z { get; private set; } = [];
    public float[] R { get; private set; } = [];
    public float[] G { get; private set; } = [];
    public float[] B { get; private set; } = [];

    /// <summary>Grows the arrays (never shrinks them) so that <paramref name="capacity"/> stars fit; reuses memory across frames.</summary>
    public void EnsureCapacity(int capacity)
    {
        if (X.Length >= capacity) return;
        X = new float[capacity]; Y = new float[capacity]; Z = new float[capacity];
        R = new float[capacity]; G = new float[capacity]; B = new float[capacity];
    }
}
