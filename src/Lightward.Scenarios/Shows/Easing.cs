namespace Lightward.Scenarios.Shows;

/// <summary>How a cue's transition moves from the old value to the new one over its duration.</summary>
public enum Easing
{
    /// <summary>Constant rate; starts and stops abruptly.</summary>
    Linear,
    /// <summary>Half a cosine: starts and ends at rest, fastest in the middle. The default: no visible jolt.</summary>
    Smooth,
    /// <summary>Quarter cosine: starts at rest and arrives at full rate.</summary>
    Accelerate,
    /// <summary>Quarter sine: leaves at full rate and comes to rest.</summary>
    Decelerate,
}

public static class EasingCurves
{
    public static readonly IReadOnlyDictionary<string, Easing> ByName = new Dictionary<string, Easing>
    {
        ["linear"] = Easing.Linear,
        ["smooth"] = Easing.Smooth,
        ["accelerate"] = Easing.Accelerate,
        ["decelerate"] = Easing.Decelerate,
    };

    /// <summary>Progress 0…1 at fraction <paramref name="x"/> (clamped to 0…1) of the transition.</summary>
    public static double Progress(this Easing easing, double x)
    {
        x = Math.Clamp(x, 0, 1);
        return easing switch
        {
            Easing.Linear => x,
            Easing.Smooth => 0.5 - 0.5 * Math.Cos(Math.PI * x),
            Easing.Accelerate => 1 - Math.Cos(Math.PI / 2 * x),
            Easing.Decelerate => Math.Sin(Math.PI / 2 * x),
            _ => throw new ArgumentOutOfRangeException(nameof(easing), easing, null),
        };
    }

    /// <summary>
    /// The largest slope of <see cref="Progress"/>: a move of angle A over duration T peaks at PeakRate·A/T, so a
    /// rate limit R needs T ≥ PeakRate·A/R.
    /// </summary>
    public static double PeakRate(this Easing easing) => easing == Easing.Linear ? 1 : Math.PI / 2;

    public static string Name(this Easing easing) => ByName.First(pair => pair.Value == easing).Key;
}
