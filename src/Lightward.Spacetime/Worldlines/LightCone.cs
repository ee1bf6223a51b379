using MathNet.Numerics.RootFinding;

namespace Lightward.Spacetime;

public enum LightConeOutcome
{
    /// <summary>The light cone meets the worldline at <see cref="LightConeEvent.Event"/>.</summary>
    Met,
    /// <summary>Never: the worldline stays beyond a horizon of the signal (e.g. a ship under constant proper
    /// acceleration that a signal started too late can never catch).</summary>
    BeyondHorizon,
    /// <summary>Never: the crossing would lie before the worldline began.</summary>
    BeforeWorldlineBegan,
}

/// <summary>Where a light cone meets a worldline, or why it never does.</summary>
public readonly record struct LightConeEvent(LightConeOutcome Outcome, FourVector Event)
{
    public bool IsMet => Outcome == LightConeOutcome.Met;
    public bool IsNever => Outcome != LightConeOutcome.Met;

    internal static LightConeEvent Met(FourVector e) => new(LightConeOutcome.Met, e);
    internal static LightConeEvent Never(LightConeOutcome why) => new(why, new FourVector(double.NaN, double.NaN, double.NaN, double.NaN));
}

/// <summary>
/// Intersections of light cones with worldlines: closed form for inertial worldlines; otherwise the crossing is
/// bracketed (it is unique, because a worldline crosses each light cone once) and refined with Brent's method to
/// <see cref="HomeTimeTolerance"/>. Horizons of hyperbolic motion are decided exactly before any search.
/// </summary>
public static class LightCone
{
    /// <summary>Home-time tolerance of the numerical searches, s: 1e-10 s is 3 cm of light travel.</summary>
    public const double HomeTimeTolerance = 1e-10;

    /// <summary>Searches give up beyond this span of home time, s (3e10 years).</summary>
    private const double SearchLimit = 1e18;

    /// <summary>The event on <paramref name="source"/> whose light reaches <paramref name="observer"/> (the past light cone of the observer).</summary>
    public static LightConeEvent Retarded(FourVector observer, IWorldline source) => Cross(observer, source, past: true);

    /// <summary>The event where a light signal sent from <paramref name="emitter"/> meets <paramref name="receiver"/>.</summary>
    public static LightConeEvent Arrival(FourVector emitter, IWorldline receiver) => Cross(emitter, receiver, past: false);

    /// <summary>Where the past (or future) light cone of <paramref name="apex"/> meets <paramref name="body"/>.</summary>
    private static LightConeEvent Cross(FourVector apex, IWorldline body, bool past) => body switch
    {
        InertialWorldline inertial => WithinLifetime(inertial, inertial.EventAtProperTime(inertial.StartProperTime + InertialCrossing(apex, inertial, past))),
        HyperbolicWorldline hyperbolic when !(past ? hyperbolic.CanBeSeenFrom(apex) : hyperbolic.CanBeReachedFrom(apex)) =>
            LightConeEvent.Never(LightConeOutcome.BeyondHorizon),
        PiecewiseWorldline piecewise => past ? RetardedOnLegs(apex, piecewise) : ArrivalOnLegs(apex, piecewise),
        _ => Search(apex, body, past),
    };

    /// <summary>
    /// Proper time from the inertial worldline's start to its crossing of the light cone of <paramref name="apex"/>.
    /// In the body's rest frame the apex sits at (T′, X′) from the start, and the crossings are T′ ∓ |X′|.
    /// </summary>
    private static double InertialCrossing(FourVector apex, InertialWorldline body, bool past)
    {
        FourVector rest = body.Frame.FromHome(apex - body.Start);
        double distance = rest.Space.Length;
        return past ? rest.T - distance : rest.T + distance;
    }

    private static LightConeEvent WithinLifetime(IWorldline body, FourVector crossing) =>
        crossing.T >= body.StartHomeTime ? LightConeEvent.Met(crossing) : LightConeEvent.Never(LightConeOutcome.BeforeWorldlineBegan);

    private static LightConeEvent RetardedOnLegs(FourVector observer, PiecewiseWorldline body)
    {
        // Look back leg by leg from the newest leg that has begun; the crossing is unique.
        IReadOnlyList<IWorldline> legs = body.Segments;
        for (int i = legs.Count - 1; i > 0; i--)
        {
            double legStart = legs[i].StartHomeTime;
            if (legStart >= observer.T) continue;
            if (LightLag(observer, legs[i].EventAtHomeTime(legStart), past: true) >= 0)
                return Refine(observer, legs[i], legStart, Math.Min(observer.T, NextStart(legs, i)), past: true);
        }
        return Retarded(observer, legs[0]);
    }

    private static LightConeEvent ArrivalOnLegs(FourVector emitter, PiecewiseWorldline body)
    {
        IReadOnlyList<IWorldline> legs = body.Segments;
        if (LightLag(emitter, body.EventAtHomeTime(Math.Max(emitter.T, body.StartHomeTime)), past: false) < 0)
            return LightConeEvent.Never(LightConeOutcome.BeforeWorldlineBegan);
        for (int i = 0; i < legs.Count - 1; i++)
        {
            double legEnd = NextStart(legs, i);
            if (legEnd <= emitter.T) continue;
            if (LightLag(emitter, legs[i].EventAtHomeTime(legEnd), past: false) <= 0)
                return Refine(emitter, legs[i], Math.Max(emitter.T, legs[i].StartHomeTime), legEnd, past: false);
        }
        return Arrival(emitter, legs[^1]);
    }

    private static double NextStart(IReadOnlyList<IWorldline> legs, int i) => i + 1 < legs.Count ? legs[i + 1].StartHomeTime : double.PositiveInfinity;

    /// <summary>
    /// How far the light signal still has to go: for the past cone, (t_apex − t) − |x_apex − x(t)|, which falls as t
    /// grows; for the future cone, |x(t) − x_apex| − (t − t_apex), which also falls. Zero on the cone.
    /// </summary>
    private static double LightLag(FourVector apex, FourVector body, bool past)
    {
        double distance = (body.Space - apex.Space).Length;
        return past ? (apex.T - body.T) - distance : distance - (body.T - apex.T);
    }

    /// <summary>Brackets the crossing by doubling steps away from the apex time, then refines it.</summary>
    private static LightConeEvent Search(FourVector apex, IWorldline body, bool past)
    {
        double start = body.StartHomeTime;
        if (!past && apex.T < start)
        {
            if (LightLag(apex, body.EventAtHomeTime(start), past: false) < 0) return LightConeEvent.Never(LightConeOutcome.BeforeWorldlineBegan);
        }
        double near = past ? apex.T : Math.Max(apex.T, start);
        if (past && near < start) return LightConeEvent.Never(LightConeOutcome.BeforeWorldlineBegan);
        double span = Math.Max((body.EventAtHomeTime(near).Space - apex.Space).Length, 1e-3);
        while (true)
        {
            double far = past ? near - span : near + span;
            if (past && far <= start)
            {
                return LightLag(apex, body.EventAtHomeTime(start), past: true) >= 0
                    ? Refine(apex, body, start, near, past: true)
                    : LightConeEvent.Never(LightConeOutcome.BeforeWorldlineBegan);
            }
            double lag = LightLag(apex, body.EventAtHomeTime(far), past);
            if (past ? lag >= 0 : lag <= 0) return Refine(apex, body, Math.Min(near, far), Math.Max(near, far), past);
            if (span > SearchLimit) return LightConeEvent.Never(LightConeOutcome.BeyondHorizon);
            span *= 2;
        }
    }

    /// <summary>Brent's method on the light lag between home times <paramref name="lower"/> and <paramref name="upper"/>, which bracket the crossing.</summary>
    private static LightConeEvent Refine(FourVector apex, IWorldline body, double lower, double upper, bool past)
    {
        Func<double, double> lag = t => LightLag(apex, body.EventAtHomeTime(t), past);
        double lowerLag = lag(lower), upperLag = lag(upper);
        if (lowerLag == 0) return LightConeEvent.Met(body.EventAtHomeTime(lower));
        if (upperLag == 0) return LightConeEvent.Met(body.EventAtHomeTime(upper));
        if (!Brent.TryFindRoot(lag, lower, upper, HomeTimeTolerance, 200, out double root))
            root = Bisect(lag, lower, upper);
        return LightConeEvent.Met(body.EventAtHomeTime(root));
    }

    /// <summary>Plain bisection, the fallback when Brent's method stalls on a kink at rounding level.</summary>
    private static double Bisect(Func<double, double> lag, double lower, double upper)
    {
        double lowerLag = lag(lower);
        for (int i = 0; i < 2000 && upper - lower > HomeTimeTolerance; i++)
        {
            double middle = lower + (upper - lower) / 2;
            if (middle <= lower || middle >= upper) break;
            double middleLag = lag(middle);
            if ((middleLag > 0) == (lowerLag > 0)) { lower = middle; lowerLag = middleLag; }
            else upper = middle;
        }
        return lower + (upper - lower) / 2;
    }
}
