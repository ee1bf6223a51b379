using System.Runtime.CompilerServices;

namespace Lightward.Spacetime;

/// <summary>
/// Advances a ship by fixed proper-time steps. Each step applies the exact motion for constant controls
/// (<see cref="FlightStep"/>), so the result does not depend on how a constant-control interval is cut into steps,
/// and the Thomas–Wigner rotation of non-collinear boosts appears by itself from composing frames.
/// Deterministic: scalar doubles in a fixed order, no wall clock, no SIMD.
/// </summary>
public sealed class FlightIntegrator
{
    private FlightStep? _cached;

    public double StepDuration { get; }

    public FlightIntegrator(double stepDuration)
    {
        if (!(stepDuration > 0) || !double.IsFinite(stepDuration)) throw new ArgumentOutOfRangeException(nameof(stepDuration), "step must be positive and finite");
        StepDuration = stepDuration;
    }

    /// <summary>One fixed step under <paramref name="controls"/>.</summary>
    public ShipState Step(in ShipState ship, Controls controls) => Advance(ship, StepFor(controls, StepDuration));

    /// <summary>A step of any positive duration (the last partial step of a segment, a coarse planning step).</summary>
    public ShipState Step(in ShipState ship, Controls controls, double duration) => Advance(ship, StepFor(controls, duration));

    /// <summary>Applies a precomputed exact step.</summary>
    // Compiled once at full optimisation as a method of its own, with the frame composition inlined into it: inlined
    // into a caller's loop, or recompiled from a profile, the step ran up to twice as slow, varying between processes.
    [MethodImpl(MethodImplOptions.NoInlining | MethodImplOptions.AggressiveOptimization)]
    public static ShipState Advance(in ShipState ship, FlightStep step)
    {
        LorentzFrame frame = ship.Frame;
        FourVector displacement = frame.ToHome(step.Displacement);
        (double properTime, double properTimeLow) = AddCompensated(ship.ProperTime, ship.ProperTimeLow, step.Duration);
        return new ShipState(ship.Event.Add(displacement), frame.Compose(step.EndFrame), properTime, properTimeLow);
    }

    private FlightStep StepFor(Controls controls, double duration)
    {
        FlightStep? cached = _cached;
        if (cached is not null && cached.Controls == controls && cached.Duration == duration) return cached;
        return _cached = new FlightStep(controls, duration);
    }

    private static (double High, double Low) AddCompensated(double high, double low, double add)
    {
        double sum = high + add;
        double bVirtual = sum - high;
        double error = (high - (sum - bVirtual)) + (add - bVirtual);
        double total = sum + (low + error);
        return (total, (low + error) - (total - sum));
    }
}
