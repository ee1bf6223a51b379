using Lightward.Scenarios.Flights;
using Lightward.Spacetime;

namespace Lightward.Host.Simulation;

/// <summary>Chooses the controls for the next physics tick from the ship as it is now.</summary>
public interface IControlSource
{
    /// <param name="ship">The physics state at the start of the tick (never an interpolated display state).</param>
    /// <param name="properStep">Proper time the tick will cover, s.</param>
    /// <param name="compression">Current time-compression factor (proper seconds per loop second).</param>
    Controls ControlsFor(in ShipState ship, double properStep, double compression);
}

/// <summary>
/// The simulation clock: fixed physics ticks decoupled from the frame rate through an accumulator. Each tick covers
/// <c>compression / TickRate</c> seconds of proper time with the exact constant-control step, so the physics of a
/// constant-thrust interval does not depend on the compression used to fly it. The display state is interpolated
/// between the last two ticks and never fed back into the physics.
/// </summary>
public sealed class FlightLoop
{
    public const double DefaultTickRate = 120;
    /// <summary>At most this many ticks per frame; a slower frame drops loop time instead of spiralling.</summary>
    public const int MaxTicksPerFrame = 8;

    private readonly FlightIntegrator _integrator;
    private readonly Flight? _flight;
    private double _accumulator;

    /// <param name="flight">
    /// A scenario's flight: every tick is flown through it, so the ship's limits, the task's verdict and the flight log
    /// are exactly those of a drill, and `lightward replay` re-flies the log bit for bit. Null for free flight.
    /// </param>
    public FlightLoop(ShipState start, double tickRate = DefaultTickRate, Flight? flight = null)
    {
        _flight = flight;
        if (!(tickRate > 0) || !double.IsFinite(tickRate)) throw new ArgumentOutOfRangeException(nameof(tickRate), "tick rate must be positive");
        TickRate = tickRate;
        _integrator = new FlightIntegrator(1 / tickRate);
        Previous = Current = start;
    }

    public double TickRate { get; }
    public double TickSeconds => 1 / TickRate;
    public ShipState Previous { get; private set; }
    public ShipState Current { get; private set; }
    public Controls LastControls { get; private set; } = Controls.Coast;
    public long Ticks { get; private set; }
    public bool Paused { get; set; }
    public int CompressionLevel { get; private set; }
    public double Compression => TimeCompression.Factor(CompressionLevel);
    /// <summary>∫|a| dτ so far: the rapidity the propellant has bought.</summary>
    public double RapiditySpent { get; private set; }

    /// <summary>How far the display sits between <see cref="Previous"/> and <see cref="Current"/>, 0…1.</summary>
    public double Alpha => Math.Clamp(_accumulator * TickRate, 0, 1);

    public ShipState Display => ShipInterpolation.Between(Previous, Current, Alpha);

    public void ChangeCompression(int steps) => CompressionLevel = Math.Clamp(CompressionLevel + steps, 0, TimeCompression.Levels - 1);

    public void ResetCompression() => CompressionLevel = 0;

    /// <summary>Lets <paramref name="loopSeconds"/> of loop time pass; returns the number of physics ticks run.</summary>
    public int Advance(double loopSeconds, IControlSource controls)
    {
        if (Paused) return 0;
        _accumulator += Math.Max(0, loopSeconds);
        int ticks = 0;
        // A whole number of ticks of loop time, up to the rounding of the sum, counts as whole.
        while (_accumulator >= TickSeconds * (1 - 1e-9) && ticks < MaxTicksPerFrame)
        {
            Tick(controls);
            _accumulator -= TickSeconds;
            ticks++;
        }
        if (ticks == MaxTicksPerFrame) _accumulator = Math.Min(_accumulator, TickSeconds);
        return ticks;
    }

    /// <summary>One tick while paused (or any time): advances the physics by exactly one tick.</summary>
    public void SingleStep(IControlSource controls)
    {
        Tick(controls);
        _accumulator = 0;
    }

    private void Tick(IControlSource source)
    {
        double properStep = Compression * TickSeconds;
        Controls controls = source.ControlsFor(Current, properStep, Compression);
        Previous = Current;
        if (_flight is not null)
        {
            _flight.Step(controls, properStep);
            Current = _flight.Ship;
            RapiditySpent = _flight.RapidityUsed;
        }
        else
        {
            Current = properStep == _integrator.StepDuration ? _integrator.Step(Current, controls) : _integrator.Step(Current, controls, properStep);
            RapiditySpent += controls.ProperAcceleration.Length * properStep;
        }
        LastControls = controls;
        Ticks++;
    }
}
