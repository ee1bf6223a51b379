using System.Security.Cryptography;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>
/// One flight through a scenario: the ship under the controls it is given, step by step with the exact
/// constant-control motion (<see cref="FlightIntegrator"/>), the propellant it spends, the task monitor that
/// decides success or failure, the time limits and, when given, the recorder that logs every step.
/// Requested thrust above the engine's maximum is scaled down, and the engine stops when the rapidity budget
/// is spent; both are applied the same way on replay, so a log holds the controls as requested.
/// </summary>
public sealed class Flight
{
    /// <summary>Crossings are placed on this grid of a run's elapsed proper time (2⁻¹⁰ s, about 1 ms), s.</summary>
    public const double CrossingGrid = 1.0 / 1024;

    private readonly FlightIntegrator _integrator;
    private readonly FlightRecorder? _recorder;
    private readonly List<FourVector> _track = [];
    private readonly double _trackSpacing;
    // The current run of steps under the same applied controls. Steps chain cheaply; at the end of a run (a new
    // plan segment, a crossing, the time limit) the state is recomputed as the exact motion from the run's start
    // over its whole elapsed time, so where segments and crossings end does not depend on the step.
    private ShipState _runStart;
    private Controls _runControls;
    private double _runElapsed, _runRapidityStart;
    private bool _runOpen;

    public Flight(Scenario scenario, FlightRecorder? recorder = null)
    {
        Scenario = scenario;
        _integrator = new FlightIntegrator(scenario.Flight.Step);
        _recorder = recorder;
        Ship = scenario.Ship.State;
        Monitor = TaskMonitor.For(scenario);
        _trackSpacing = scenario.Flight.HomeTimeLimit / 2000;
        _track.Add(Ship.Position);
    }

    public Scenario Scenario { get; }
    public ShipState Ship { get; private set; }
    public TaskMonitor Monitor { get; }
    public TaskVerdict? Verdict { get; private set; }
    public bool IsOver => Verdict is not null;
    public double StepDuration => _integrator.StepDuration;
    public long Steps { get; private set; }
    /// <summary>∫|a| dτ so far.</summary>
    public double RapidityUsed { get; private set; }
    public double RapidityLeft => Math.Max(0, Scenario.Ship.RapidityBudget - RapidityUsed);
    public double ShipTimeFlown => Ship.ShipTime;
    public double HomeTimeFlown => Ship.HomeTime - Scenario.Ship.Start.T;
    /// <summary>Home-frame events along the flight, thinned to about 2000, for plots.</summary>
    public IReadOnlyList<FourVector> Track => _track;

    public delegate bool Condition(in ShipState ship);

    /// <summary>The controls the ship actually flies when <paramref name="requested"/> is asked for over <paramref name="duration"/>.</summary>
    public Controls Applied(Controls requested, double duration)
    {
        Vec3 thrust = requested.ProperAcceleration, rate = requested.AttitudeRate;
        double magnitude = thrust.Length;
        if (magnitude > Scenario.Ship.MaxAcceleration) thrust *= Scenario.Ship.MaxAcceleration / magnitude;
        double turn = rate.Length;
        if (turn > Scenario.Ship.MaxTurnRate) rate *= Scenario.Ship.MaxTurnRate / turn;
        double burn = thrust.Length * duration;
        if (burn > RapidityLeft) thrust = burn > 0 ? thrust * (RapidityLeft / burn) : Vec3.Zero;
        return new Controls(thrust, rate);
    }

    /// <summary>
    /// Ends the current run on its exact state and starts a new one at the next step, even if the controls stay the
    /// same (a pilot does this between plan segments). Recorded, so replays do the same.
    /// </summary>
    public void BeginRun()
    {
        _recorder?.RecordRunStart();
        if (_runOpen) Ship = Motion(_runStart, _runControls, _runElapsed);
        _runOpen = false;
    }

    /// <summary>Where the ship would be after <paramref name="duration"/> under <paramref name="requested"/>, without flying it.</summary>
    public ShipState Preview(Controls requested, double duration) => _integrator.Step(Ship, Applied(requested, duration), duration);

    /// <summary>One fixed step.</summary>
    public void Step(Controls requested) => Step(requested, StepDuration);

    /// <summary>
    /// A step of any positive duration: the last partial step of a segment, or a host tick. A step that would
    /// pass the ship time limit is cut short to end on it.
    /// </summary>
    public void Step(Controls requested, double duration)
    {
        if (!(duration > 0) || !double.IsFinite(duration)) throw new ArgumentOutOfRangeException(nameof(duration), "step must be positive and finite");
        _recorder?.Record(requested, duration);
        Controls applied = Applied(requested, duration);
        bool continues = _runOpen && applied == _runControls;
        ShipState origin = continues ? _runStart : Ship;
        double before = continues ? _runElapsed : 0;
        double limitElapsed = Scenario.Flight.ShipTimeLimit - origin.ShipTime;
        bool lastStep = Verdict is null && before + duration >= limitElapsed;
        if (lastStep)
            Advance(applied, origin, continues, Math.Max(limitElapsed, before + double.Epsilon), anchored: true);
        else
            Advance(applied, origin, continues, before + duration, anchored: false);
        if (lastStep && Verdict is null) Verdict = Monitor.TimeUp("ship time limit");
    }

    /// <summary>
    /// A step of at most <paramref name="step"/> that ends where <paramref name="reached"/> first holds, found by
    /// bisection on the exact motion from the run's start and placed on <see cref="CrossingGrid"/>, so the crossing
    /// does not depend on how the run was cut into steps. The caller has checked that it holds after the full step
    /// and calls <see cref="BeginRun"/> next.
    /// </summary>
    public void StepUntil(Controls requested, double step, Condition reached)
    {
        Controls applied = Applied(requested, step);
        bool continues = _runOpen && applied == _runControls;
        ShipState origin = continues ? _runStart : Ship;
        double start = continues ? _runElapsed : 0, low = start, high = start + step;
        while (true)
        {
            double middle = low + (high - low) / 2;
            if (middle <= low || middle >= high) break;
            if (reached(Motion(origin, applied, middle))) high = middle;
            else low = middle;
        }
        high = Math.Max(Math.Ceiling(high / CrossingGrid) * CrossingGrid, Math.BitIncrement(start));
        // The step is an ordinary one of duration high − start (so a replay repeats it), chosen so that the run's
        // elapsed time comes out as exactly high; the pilot's next BeginRun puts the ship on the exact motion there.
        while (start + (high - start) != high) high = Math.BitIncrement(high);
        Step(requested, high - start);
    }

    private void Advance(Controls applied, ShipState origin, bool continues, double elapsed, bool anchored)
    {
        ShipState previous = Ship;
        double rapidityBefore = RapidityUsed, duration = continues ? elapsed - _runElapsed : elapsed;
        Ship = anchored ? Motion(origin, applied, elapsed) : _integrator.Step(previous, applied, duration);
        if (!continues) (_runStart, _runControls, _runRapidityStart) = (origin, applied, RapidityUsed);
        (_runElapsed, _runOpen) = (elapsed, true);
        RapidityUsed = _runRapidityStart + applied.ProperAcceleration.Length * elapsed;
        Steps++;
        if (Ship.HomeTime - _track[^1].T >= _trackSpacing) _track.Add(Ship.Position);
        if (Verdict is not null) return;
        Verdict = Monitor.Observe(previous, Ship);
        if (Verdict is { AtPreviousStep: true })
        {
            // The task was done best one step ago: the flight ends there.
            (Ship, RapidityUsed, _runOpen) = (previous, rapidityBefore, false);
        }
        if (Verdict is null && HomeTimeFlown >= Scenario.Flight.HomeTimeLimit) Verdict = Monitor.TimeUp("home time limit");
        if (Verdict is not null && _track[^1] != Ship.Position) _track.Add(Ship.Position);
    }

    private static ShipState Motion(in ShipState start, Controls applied, double elapsed) =>
        FlightIntegrator.Advance(start, new FlightStep(applied, elapsed));

    /// <summary>SHA-256 over the exact bits of the ship's state and the propellant spent: equal hashes mean identical flights.</summary>
    public string StateHash()
    {
        ShipState s = Ship;
        double[] bits =
        [
            s.Event.High.T, s.Event.High.X, s.Event.High.Y, s.Event.High.Z, s.Event.Low.T, s.Event.Low.X, s.Event.Low.Y, s.Event.Low.Z,
            s.Frame.Velocity.Rapidity, s.Frame.Velocity.Direction.X, s.Frame.Velocity.Direction.Y, s.Frame.Velocity.Direction.Z,
            s.Frame.Orientation.W, s.Frame.Orientation.X, s.Frame.Orientation.Y, s.Frame.Orientation.Z,
            s.ProperTime, s.ProperTimeLow, RapidityUsed,
        ];
        var bytes = new byte[bits.Length * 8];
        for (int i = 0; i < bits.Length; i++) BitConverter.TryWriteBytes(bytes.AsSpan(i * 8), BitConverter.DoubleToInt64Bits(bits[i]));
        return Convert.ToHexStringLower(SHA256.HashData(bytes));
    }
}
