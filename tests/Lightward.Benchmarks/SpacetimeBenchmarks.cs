using BenchmarkDotNet.Attributes;
using Lightward.Spacetime;

namespace Lightward.Benchmarks;

/// <summary>
/// Flight integrator throughput, per step (goal: at least 10 million steps/s on one core, i.e. ≤ 100 ns per step).
/// Coasting is the baseline; thrusting (ahead, about 14° off the motion; across it; against it) and thrust with a turn
/// add the velocity composition and the Thomas–Wigner rotation.
/// </summary>
[MemoryDiagnoser]
public class SpacetimeIntegratorBenchmarks
{
    private const int Steps = 1000;
    private readonly FlightStep _coast = new(Controls.Coast, 1e-2);
    private readonly FlightStep _thrust = new(new Controls(new Vec3(0, 0, 1e-3), Vec3.Zero), 1e-2);
    private readonly FlightStep _thrustAcross = new(new Controls(new Vec3(1e-3, 0, 0), Vec3.Zero), 1e-2);
    private readonly FlightStep _brake = new(new Controls(new Vec3(0, 0, -1e-3), Vec3.Zero), 1e-2);
    private readonly FlightStep _thrustAndTurn = new(new Controls(new Vec3(2e-4, -1e-4, 1e-3), new Vec3(0.01, 0.02, -0.005)), 1e-2);
    private readonly ShipState _start = new(
        new CompensatedEvent(new FourVector(0, 1000 * Units.LightYear, 0, 0)),
        new LorentzFrame(new Velocity(3, new Vec3(0.6, 0, 0.8)), Rotation.FromAxisAngle(new Vec3(1, 2, 3), 0.7)), 0);

    private ShipState Fly(FlightStep step)
    {
        ShipState ship = _start;
        for (int i = 0; i < Steps; i++) ship = FlightIntegrator.Advance(ship, step);
        return ship;
    }

    [Benchmark(Baseline = true, OperationsPerInvoke = Steps)]
    public ShipState Coast() => Fly(_coast);

    [Benchmark(OperationsPerInvoke = Steps)]
    public ShipState ThrustAlongMotion() => Fly(_thrust);

    [Benchmark(OperationsPerInvoke = Steps)]
    public ShipState ThrustAcrossMotion() => Fly(_thrustAcross);

    [Benchmark(OperationsPerInvoke = Steps)]
    public ShipState BrakeAgainstMotion() => Fly(_brake);

    [Benchmark(OperationsPerInvoke = Steps)]
    public ShipState ThrustAndTurn() => Fly(_thrustAndTurn);
}

/// <summary>What `lightward plan` computes: the closed-form plan, and light-cone searches on the flight it returns.</summary>
[MemoryDiagnoser]
public class SpacetimePlanBenchmarks
{
    private readonly MissionRequest _flip = new(MissionProfile.Flip, 4.2 * Units.LightYear, Units.G);
    private readonly MissionRequest _coast = new(MissionProfile.Coast, 12 * Units.LightYear, Units.G, 2.5, 1.0);
    private readonly MissionPlan _plan = MissionPlanner.Plan(new MissionRequest(MissionProfile.Coast, 12 * Units.LightYear, Units.G, 2.5));
    private readonly HyperbolicWorldline _hyperbola = new(new FourVector(0, 0, 0, 0), new Velocity(2, Vec3.UnitX), Units.G * new Vec3(0.3, 1, 0));

    [Benchmark(Baseline = true)]
    public MissionPlan PlanFlip() => MissionPlanner.Plan(_flip);

    [Benchmark]
    public MissionPlan PlanCoastWithPropellant() => MissionPlanner.Plan(_coast);

    [Benchmark]
    public LightConeEvent MessageFromHomeReachesShip() => LightCone.Arrival(new FourVector(3 * Units.JulianYear, 0, 0, 0), _plan.Worldline);

    [Benchmark]
    public LightConeEvent RetardedEventOnHyperbola() => LightCone.Retarded(new FourVector(5e8, 1e8, 2e8, 0), _hyperbola);
}
