namespace Lightward.Spacetime;

/// <summary>
/// The history of a body: where it is at each home time, how fast it moves, what its own clock reads and how its
/// own axes sit. Home time t and all events are home coordinates (c = 1, seconds and light-seconds).
/// </summary>
public interface IWorldline
{
    /// <summary>The body's event at home time <paramref name="t"/>.</summary>
    FourVector EventAtHomeTime(double t);

    /// <summary>The body's four-velocity (γ, γβ) at home time <paramref name="t"/>.</summary>
    FourVector FourVelocityAtHomeTime(double t);

    /// <summary>What the body's own clock reads at home time <paramref name="t"/>.</summary>
    double ProperTimeAtHomeTime(double t);

    /// <summary>The home time at which the body's own clock reads <paramref name="tau"/>.</summary>
    double HomeTimeAtProperTime(double tau);

    /// <summary>The body's own axes → home coordinates at home time <paramref name="t"/>.</summary>
    LorentzFrame RestFrameAtHomeTime(double t);

    /// <summary>The home time at which the body came into being (−∞ when it always existed); light-cone searches
    /// report <see cref="LightConeOutcome.BeforeWorldlineBegan"/> for crossings earlier than this.</summary>
    double StartHomeTime => double.NegativeInfinity;
}
