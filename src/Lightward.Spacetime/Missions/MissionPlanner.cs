namespace Lightward.Spacetime;

/// <summary>How a straight trip between two places at rest relative to home is flown.</summary>
public enum MissionProfile
{
    /// <summary>Accelerate to the midpoint, turn round, brake at the same rate, arrive at rest.</summary>
    Flip,
    /// <summary>Accelerate to a cruise rapidity, coast, brake at the same rate, arrive at rest.</summary>
    Coast,
    /// <summary>Accelerate the whole way and pass the destination at top speed.</summary>
    Flyby,
}

/// <summary>Which part of a <see cref="MissionRequest"/> a problem is about.</summary>
public enum MissionInput { Distance, Acceleration, Cruise, Exhaust, MassRatioLimit }

/// <summary>A mission that cannot be flown as asked; <see cref="Input"/> says which value to change.</summary>
public sealed class MissionPlanException(MissionInput input, string problem) : UserInputException(problem)
{
    public MissionInput Input { get; } = input;
}

/// <param name="Distance">Trip length, light-seconds.</param>
/// <param name="Acceleration">Proper acceleration felt aboard while the engine runs, 1/s.</param>
/// <param name="CruiseRapidity">Coast profile: rapidity held while coasting.</param>
/// <param name="ExhaustSpeed">Exhaust speed as a fraction of c, for the mass ratio; null leaves propellant out.</param>
/// <param name="MassRatioLimit">Largest affordable m₀/m₁; needs <paramref name="ExhaustSpeed"/>.</param>
public sealed record MissionRequest(
    MissionProfile Profile, double Distance, double Acceleration,
    double? CruiseRapidity = null, double? ExhaustSpeed = null, double? MassRatioLimit = null);

/// <summary>A moment of the flight: ship clock, home clock, distance from home (light-seconds) and rapidity.</summary>
public readonly record struct MissionMoment(double ShipTime, double HomeTime, double Distance, double Rapidity)
{
    public double Beta => Math.Tanh(Rapidity);
    public double Gamma => Math.Cosh(Rapidity);
    /// <summary>1 − β = e^(−φ)/cosh φ, exact at any rapidity.</summary>
    public double OneMinusBeta => Math.Exp(-Rapidity) / Math.Cosh(Rapidity);
    /// <summary>Home time at which a light signal sent from here reaches home.</summary>
    public double SeenAtHome => HomeTime + Distance;
    /// <summary>Latest home time at which a light signal sent from home reaches the ship by this moment.</summary>
    public double LatestMessageFromHome => HomeTime - Distance;
}

public sealed record MissionPhase(string Name, MissionMoment Start, MissionMoment End);

/// <summary>A named moment where one phase ends and the next begins (departure, turnover, arrival…).</summary>
public sealed record MissionMilestone(string Name, MissionMoment Moment);

/// <summary>A flown plan: phases in order, the peak, the propellant, and the exact worldline of the ship.</summary>
public sealed record MissionPlan(
    MissionRequest Request, IReadOnlyList<MissionMilestone> Milestones, IReadOnlyList<MissionPhase> Phases,
    double PeakRapidity, double RapidityBudget, double? LogMassRatio, PiecewiseWorldline Worldline)
{
    public MissionMoment Departure => Phases[0].Start;
    public MissionMoment Arrival => Phases[^1].End;
    public double ShipTime => Arrival.ShipTime;
    public double HomeTime => Arrival.HomeTime;
    /// <summary>m₀/m₁, or +∞ when it exceeds the range of a double (see <see cref="LogMassRatio"/>).</summary>
    public double? MassRatio => LogMassRatio is double log ? Math.Exp(log) : null;
    /// <summary>Home time at which the destination (at rest at the trip's end) sees the ship leave.</summary>
    public double DestinationSeesDeparture => Request.Distance;
}

/// <summary>
/// Plans straight trips with constant proper acceleration from exact closed forms: from rest, after own time τ,
/// t = sinh(aτ)/a, x = (cosh(aτ) − 1)/a, φ = aτ (Rindler 2006, ch. 3, hyperbolic motion); written as sinh and 2 sinh²(φ/2), and
/// φ = acosh(1 + a x) as 2 asinh(√(a x/2)), so that nothing cancels from rest to rapidity 25 and beyond.
/// The ship leaves home (at rest at the origin) at home time 0 along home +Z and its clock then reads 0.
/// </summary>
public static class MissionPlanner
{
    public static MissionPlan Plan(MissionRequest request)
    {
        double distance = request.Distance, a = request.Acceleration;
        if (!(distance > 0) || !double.IsFinite(distance)) throw new MissionPlanException(MissionInput.Distance, "must be a positive, finite length");
        if (!(a > 0) || !double.IsFinite(a)) throw new MissionPlanException(MissionInput.Acceleration, "must be a positive, finite acceleration");
        if (request.CruiseRapidity is not null && request.Profile != MissionProfile.Coast)
            throw new MissionPlanException(MissionInput.Cruise, $"only the coast profile has a cruise; {request.Profile.ToString().ToLowerInvariant()} sets its own top speed");

        (MissionMilestone[] milestones, string[] phaseNames, double peak, double budget) = request.Profile switch
        {
            MissionProfile.Flip => Flip(distance, a),
            MissionProfile.Coast => Coast(distance, a, request.CruiseRapidity),
            _ => Flyby(distance, a),
        };
        double? logMassRatio = Propellant(request, budget);
        MissionPhase[] phases = phaseNames.Select((name, i) => new MissionPhase(name, milestones[i].Moment, milestones[i + 1].Moment)).ToArray();
        return new MissionPlan(request, milestones, phases, peak, budget, logMassRatio, Fly(phases, a));
    }

    private static readonly MissionMoment Departure = new(0, 0, 0, 0);

    private static (MissionMilestone[], string[], double Peak, double Budget) Flip(double distance, double a)
    {
        double peak = HyperbolicMath.AcoshOnePlus(a * distance / 2);
        MissionMoment turnover = AfterBurn(peak, a, Departure, speedingUp: true);
        MissionMoment arrival = AfterBurn(peak, a, turnover, speedingUp: false) with { Distance = distance };
        return ([new("departure", Departure), new("turnover", turnover), new("arrival", arrival)], ["accelerate", "brake"], peak, 2 * peak);
    }

    private static (MissionMilestone[], string[], double Peak, double Budget) Coast(double distance, double a, double? cruise)
    {
        if (cruise is not double rapidity) throw new MissionPlanException(MissionInput.Cruise, "the coast profile needs a cruise speed or rapidity");
        if (!(rapidity > 0) || !double.IsFinite(rapidity)) throw new MissionPlanException(MissionInput.Cruise, "cruise must be a speed above 0 and below c");
        MissionMoment cruising = AfterBurn(rapidity, a, Departure, speedingUp: true);
        double coastDistance = distance - 2 * cruising.Distance;
        if (coastDistance < 0)
        {
            double highest = HyperbolicMath.AcoshOnePlus(a * distance / 2);
            throw new MissionPlanException(MissionInput.Cruise, FormattableString.Invariant(
                $"cruise rapidity {rapidity:G6} cannot be reached and shed within the distance at this acceleration; the highest cruise for this trip is rapidity {highest:G6} (speed {Math.Tanh(highest):G9} c)"));
        }
        var braking = new MissionMoment(
            cruising.ShipTime + coastDistance / Math.Sinh(rapidity),
            cruising.HomeTime + coastDistance / Math.Tanh(rapidity),
            cruising.Distance + coastDistance, rapidity);
        MissionMoment arrival = AfterBurn(rapidity, a, braking, speedingUp: false) with { Distance = distance };
        return ([new("departure", Departure), new("cruise reached", cruising), new("braking begins", braking), new("arrival", arrival)],
            ["accelerate", "coast", "brake"], rapidity, 2 * rapidity);
    }

    private static (MissionMilestone[], string[], double Peak, double Budget) Flyby(double distance, double a)
    {
        double peak = HyperbolicMath.AcoshOnePlus(a * distance);
        MissionMoment pass = AfterBurn(peak, a, Departure, speedingUp: true) with { Distance = distance };
        return ([new("departure", Departure), new("passing destination", pass)], ["accelerate"], peak, peak);
    }

    /// <summary>The moment after a burn that changes the rapidity by <paramref name="rapidityChange"/> from (or down to) rest.</summary>
    private static MissionMoment AfterBurn(double rapidityChange, double a, MissionMoment from, bool speedingUp) => new(
        from.ShipTime + rapidityChange / a,
        from.HomeTime + Math.Sinh(rapidityChange) / a,
        from.Distance + HyperbolicMath.CoshMinusOne(rapidityChange) / a,
        speedingUp ? from.Rapidity + rapidityChange : from.Rapidity - rapidityChange);

    private static double? Propellant(MissionRequest request, double budget)
    {
        if (request.ExhaustSpeed is not double exhaust)
        {
            if (request.MassRatioLimit is not null) throw new MissionPlanException(MissionInput.MassRatioLimit, "a mass-ratio limit needs an exhaust speed");
            return null;
        }
        if (!(exhaust > 0 && exhaust <= 1)) throw new MissionPlanException(MissionInput.Exhaust, "exhaust speed must be above 0 and at most c");
        double log = RocketEquation.LogMassRatio(budget, exhaust);
        if (request.MassRatioLimit is double limit)
        {
            if (!(limit > 1) || !double.IsFinite(limit)) throw new MissionPlanException(MissionInput.MassRatioLimit, "must be a finite number above 1");
            if (log > Math.Log(limit))
                throw new MissionPlanException(MissionInput.MassRatioLimit, FormattableString.Invariant(
                    $"the trip needs a rapidity change of {budget:G6}, i.e. mass ratio e^{log:G6} = {Math.Exp(log):G4}, above the limit {limit:G6}, which buys a rapidity change of {RocketEquation.RapidityBudget(exhaust, limit):G6}"));
        }
        return log;
    }

    /// <summary>The ship's exact worldline: it waits at home, then flies the phases, turning round before braking.</summary>
    private static PiecewiseWorldline Fly(IReadOnlyList<MissionPhase> phases, double a)
    {
        var builder = new PiecewiseWorldline.Builder(new FourVector(0, 0, 0, 0), LorentzFrame.Identity);
        Vec3 push = a * Vec3.UnitZ;
        foreach (MissionPhase phase in phases)
        {
            double duration = phase.End.ShipTime - phase.Start.ShipTime;
            if (!(duration > 0)) continue;
            if (phase.End.Rapidity < phase.Start.Rapidity) builder.Turn(Rotation.FromAxisAngle(Vec3.UnitY, Math.PI));
            if (phase.End.Rapidity == phase.Start.Rapidity) builder.Coast(duration);
            else builder.Accelerate(push, duration);
        }
        return builder.Build();
    }
}
