using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Shows;

/// <summary>
/// A burn plan flown by the show's ship from a given state, as a function of the ship time elapsed since the plan
/// began. The plan is flown once, by the drill's own <see cref="PlanPilot"/> through a <see cref="Flight"/>, and kept
/// as its runs of constant controls; the ship at any elapsed time is the exact motion from the start of its run, so
/// it does not depend on which moments were asked for before (shards, resumed renders).
/// </summary>
public sealed class PlanTrajectory
{
    /// <summary>A stretch of constant applied controls, from its first state (in show coordinates).</summary>
    private readonly record struct Run(double Start, ShipState Ship, Controls Controls, double BurnBefore);

    private readonly List<Run> _runs = [];

    /// <param name="start">The show's ship where the plan begins.</param>
    /// <param name="turnRate">Fastest turn of the show's ship, rad/s of ship time: also the rate of "face" turns.</param>
    /// <param name="step">Fixed ship-time step the plan is flown at (turns toward a "face" direction are steered once per step).</param>
    /// <param name="shipTimeLimit">Ship time after which the show can no longer see the plan: the flight stops there.</param>
    public PlanTrajectory(BurnPlan plan, ShipState start, double turnRate, double step, double shipTimeLimit)
    {
        Start = start;
        // The plan is flown from the home-clock reading of the start (so "until_home_time" reads the show's home clock)
        // at the origin of space (so "until_distance" is measured from where the plan begins), and moved into place.
        var origin = new FourVector(start.HomeTime, 0, 0, 0);
        var flight = new Flight(ShowShip(plan, origin, start.Frame, turnRate, step, shipTimeLimit));
        int segment = -1;
        foreach (PlanStep planStep in PlanPilot.Schedule(plan, flight))
        {
            Controls applied = flight.Applied(planStep.Requested, flight.StepDuration);
            if (planStep.Segment != segment || _runs.Count == 0 || applied != _runs[^1].Controls)
                Add(flight.Ship, applied, origin);
            segment = planStep.Segment;
        }
        flight.BeginRun();
        Add(flight.Ship, Controls.Coast, origin);
    }

    public ShipState Start { get; }

    /// <summary>Ship time from the start of the plan to the end of its last segment (or to where the show stops seeing it), s.</summary>
    public double Length => _runs[^1].Start;

    /// <summary>The ship after <paramref name="elapsed"/> seconds of ship time on the plan.</summary>
    public ShipState At(double elapsed)
    {
        Run run = _runs[RunAt(elapsed)];
        double into = elapsed - run.Start;
        return into > 0 ? FlightIntegrator.Advance(run.Ship, new FlightStep(run.Controls, into)) : run.Ship;
    }

    /// <summary>The controls flown at <paramref name="elapsed"/>: thrust (proper acceleration) and turn rate, ship axes.</summary>
    public Controls ControlsAt(double elapsed) => _runs[RunAt(elapsed)].Controls;

    /// <summary>Rapidity the plan still burns after <paramref name="elapsed"/>: ∫|a| dτ over what is left of it.</summary>
    public double BurnLeft(double elapsed)
    {
        Run run = _runs[RunAt(elapsed)];
        double burned = run.BurnBefore + run.Controls.ProperAcceleration.Length * Math.Max(0, elapsed - run.Start);
        return Math.Max(0, _runs[^1].BurnBefore - burned);
    }

    private void Add(ShipState local, Controls controls, FourVector origin)
    {
        double elapsed = local.ShipTime;
        double burn = _runs.Count == 0 ? 0 : _runs[^1].BurnBefore + _runs[^1].Controls.ProperAcceleration.Length * (elapsed - _runs[^1].Start);
        _runs.Add(new Run(elapsed, MovedIntoPlace(local, origin), controls, burn));
    }

    /// <summary>The plan's own state moved to the show's ship: its displacement from the plan's origin added to the start event, its ship time added to the start's.</summary>
    private ShipState MovedIntoPlace(in ShipState local, FourVector origin)
    {
        CompensatedEvent where = Start.Event.Add(local.Event.RelativeTo(origin));
        // Two-sum of the start's ship time and the elapsed ship time, so a short plan late in a long show keeps its clock exact.
        double high = Start.ProperTime, add = local.ShipTime, sum = high + add, virtualAdd = sum - high;
        double error = (high - (sum - virtualAdd)) + (add - virtualAdd) + Start.ProperTimeLow;
        return new ShipState(where, local.Frame, sum + error, error - ((sum + error) - sum));
    }

    private int RunAt(double elapsed)
    {
        int low = 0, high = _runs.Count - 1;
        while (low < high)
        {
            int middle = (low + high + 1) / 2;
            if (_runs[middle].Start <= elapsed) low = middle;
            else high = middle - 1;
        }
        return low;
    }

    /// <summary>
    /// The show's ship as a free-flight scenario for the plan's flight: an engine and propellant without limit (a show
    /// has no ship to run out of), turning at the show's rate, starting at <paramref name="origin"/> in <paramref name="frame"/>.
    /// </summary>
    private static Scenario ShowShip(BurnPlan plan, FourVector origin, LorentzFrame frame, double turnRate, double step, double shipTimeLimit) => new(
        plan.SourcePath, plan.ContentHash, "show ship", "", 0,
        new FlightSettings(step, shipTimeLimit, double.PositiveInfinity),
        new ShipStart(origin, frame.Velocity, frame.Orientation, double.PositiveInfinity, turnRate, 1, double.PositiveInfinity, double.PositiveInfinity),
        [], new SkySettings(SkySource.Procedural, null, 0, 0), new GridSettings(0, 0, "home"),
        new TaskSpec(TaskKind.Free, null, Vec3.Zero, 0, 0, 0, 0, 0), ScoringWeights.Default);
}
