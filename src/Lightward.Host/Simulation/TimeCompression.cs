namespace Lightward.Host.Simulation;

/// <summary>The time-compression ladder: ×1, ×10, … ×10⁸ of ship proper time per second of loop time.</summary>
public static class TimeCompression
{
    public const int Levels = 9;

    /// <summary>Proper-time seconds simulated per loop second at ladder position <paramref name="level"/> (0 = ×1).</summary>
    public static double Factor(int level) => Math.Pow(10, Math.Clamp(level, 0, Levels - 1));

    public static string Label(int level) => level < 4 ? $"x{Factor(level):0}" : $"x1e{level}";
}
