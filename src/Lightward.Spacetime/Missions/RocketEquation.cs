namespace Lightward.Spacetime;

/// <summary>
/// The relativistic rocket equation (Ackeret 1946): a rocket whose exhaust leaves at speed v_e (in the rocket's
/// frame) changes its rapidity by Δφ = (v_e/c)·ln(m₀/m₁) while its mass falls from m₀ to m₁, whatever the burn
/// schedule. A photon rocket has v_e = c.
/// </summary>
public static class RocketEquation
{
    /// <summary>Exhaust speed of a photon rocket, as a fraction of c.</summary>
    public const double PhotonExhaust = 1.0;

    /// <summary>Rapidity change Δφ bought by mass ratio m₀/m₁ with exhaust speed β_e = v_e/c.</summary>
    public static double RapidityBudget(double exhaustSpeed, double massRatio)
    {
        RequireExhaust(exhaustSpeed);
        if (!(massRatio >= 1)) throw new ArgumentOutOfRangeException(nameof(massRatio), "mass ratio must be at least 1");
        return exhaustSpeed * Math.Log(massRatio);
    }

    /// <summary>Mass ratio m₀/m₁ needed for a rapidity change Δφ; +∞ when it exceeds the range of a double.</summary>
    public static double MassRatio(double rapidityChange, double exhaustSpeed) => Math.Exp(LogMassRatio(rapidityChange, exhaustSpeed));

    /// <summary>ln(m₀/m₁) = Δφ/β_e, finite even when the mass ratio itself overflows.</summary>
    public static double LogMassRatio(double rapidityChange, double exhaustSpeed)
    {
        RequireExhaust(exhaustSpeed);
        if (!(rapidityChange >= 0)) throw new ArgumentOutOfRangeException(nameof(rapidityChange), "rapidity change must be non-negative");
        return rapidityChange / exhaustSpeed;
    }

    private static void RequireExhaust(double exhaustSpeed)
    {
        if (!(exhaustSpeed > 0 && exhaustSpeed <= 1)) throw new ArgumentOutOfRangeException(nameof(exhaustSpeed), "exhaust speed must lie in (0, c]");
    }
}
