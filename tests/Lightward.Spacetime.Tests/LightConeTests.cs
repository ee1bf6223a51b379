namespace Lightward.Spacetime.Tests;

public class LightConeTests
{
    /// <summary>Hides the worldline's type so that LightCone takes its general bracketing search.</summary>
    private sealed class Opaque(IWorldline inner) : IWorldline
    {
        public FourVector EventAtHomeTime(double t) => inner.EventAtHomeTime(t);
        public FourVector FourVelocityAtHomeTime(double t) => inner.FourVelocityAtHomeTime(t);
        public double ProperTimeAtHomeTime(double t) => inner.ProperTimeAtHomeTime(t);
        public double HomeTimeAtProperTime(double tau) => inner.HomeTimeAtProperTime(tau);
        public LorentzFrame RestFrameAtHomeTime(double t) => inner.RestFrameAtHomeTime(t);
        public double StartHomeTime => inner.StartHomeTime;
    }

    /// <summary>
    /// Retarded time of a source in uniform motion x(t) = x₀ + v t seen from (t_o, x_o): the retarded-time condition
    /// t_o − t_r = |x_o − x(t_r)| (Jackson, Classical Electrodynamics, 3rd ed. (1999), §14.1) is a quadratic in
    /// T = t_o − t_r: (1 − β²)T² − 2(Δ·v)T − |Δ|² = 0 with Δ = x_o − x(t_o); the positive root.
    /// </summary>
    private static double RetardedDelay(FourVector observer, Vec3 x0, Vec3 v)
    {
        Vec3 delta = observer.Space - (x0 + observer.T * v);
        double dv = Vec3.Dot(delta, v), b2 = v.LengthSquared;
        return (dv + Math.Sqrt(dv * dv + (1 - b2) * delta.LengthSquared)) / (1 - b2);
    }

    [Theory]
    [InlineData(0.0, 0.0, 0.0)]
    [InlineData(0.5, 0.2, -0.1)]
    [InlineData(-0.9, 0.3, 0.2)]
    public void Retarded_event_of_an_inertial_source_matches_the_retarded_time_condition(double vx, double vy, double vz)
    {
        Vec3 x0 = new(10, -4, 2), v = new(vx, vy, vz);
        var source = new InertialWorldline(new FourVector(0, x0), Velocity.FromBeta(v));
        var observer = new FourVector(50, 3, 8, -20);
        double expected = observer.T - RetardedDelay(observer, x0, v);
        Assert.Equal(expected, LightCone.Retarded(observer, source).Event.T, 11);
        Assert.Equal(expected, LightCone.Retarded(observer, new Opaque(source)).Event.T, 8);
    }

    [Fact]
    public void Arrival_on_an_inertial_receiver_is_the_time_reversed_condition()
    {
        // Arrival is retarded time with time reversed: t_a − t_e = |x(t_a) − x_e| (Jackson 1999, §14.1, with t → −t, v → −v).
        Vec3 x0 = new(-30, 5, 0), v = new(0.6, -0.2, 0.1);
        var receiver = new InertialWorldline(new FourVector(0, x0), Velocity.FromBeta(v));
        var emitter = new FourVector(4, 0, 0, 0);
        var mirrored = new FourVector(-emitter.T, emitter.Space);
        double expected = emitter.T + RetardedDelay(mirrored, x0, -v);
        Assert.Equal(expected, LightCone.Arrival(emitter, receiver).Event.T, 11);
        Assert.Equal(expected, LightCone.Arrival(emitter, new Opaque(receiver)).Event.T, 8);
    }

    [Fact]
    public void Light_chasing_a_rapidity_20_ship_catches_it_without_cancellation()
    {
        // The ship passes the origin at t = 0; light leaves x = −1 then. Catch-up: t − 1 = βt → t = 1/(1 − β) with
        // 1 − β = e^(−φ)/cosh φ (identity of tanh), about 1.2e17 s: a subtraction 1 − β would give nothing here.
        var ship = new InertialWorldline(new FourVector(0, 0, 0, 0), new Velocity(20, Vec3.UnitX));
        LightConeEvent hit = LightCone.Arrival(new FourVector(0, -1, 0, 0), ship);
        double oneMinusBeta = Math.Exp(-20) / Math.Cosh(20);
        Assert.Equal(1, hit.Event.T * oneMinusBeta, 12);
    }

    [Theory]
    [InlineData(0.25)]
    [InlineData(0.0)]
    [InlineData(-0.5)]
    [InlineData(-3.0)]
    public void Signal_from_the_origin_chases_a_ship_under_constant_proper_acceleration(double sentTimesA)
    {
        // Rindler (2006), ch. 3, hyperbolic motion: a ship at rest at x = c²/a at t = 0, pushed along +x, follows
        // x² − t² = 1/a² (c = 1) and never crosses the null line x = t, its horizon. A signal x = t − t₀ from the
        // origin meets it where (t − t₀)² = 1/a² + t², i.e. t = (t₀² − 1/a²)/(2t₀), which needs t₀ < 0;
        // for t₀ ≥ 0 it never arrives.
        double a = Units.G;
        var ship = new HyperbolicWorldline(new FourVector(0, 1 / a, 0, 0), Velocity.Rest, a * Vec3.UnitX);
        double sent = sentTimesA / a;
        LightConeEvent exact = LightCone.Arrival(new FourVector(sent, 0, 0, 0), ship);
        LightConeEvent searched = LightCone.Arrival(new FourVector(sent, 0, 0, 0), new Opaque(ship));
        if (sent >= 0)
        {
            Assert.Equal(LightConeOutcome.BeyondHorizon, exact.Outcome);
            // A search can only tell "never" when the gap stays well above rounding; on the horizon itself it cannot.
            if (sent > 0) Assert.True(searched.IsNever);
            return;
        }
        double expected = (sent * sent - 1 / (a * a)) / (2 * sent);
        Assert.True(exact.IsMet);
        Assert.Equal(1, exact.Event.T / expected, 9);
        Assert.Equal(1, searched.Event.T / expected, 9);

        // The same ship, created only at t = 0: a signal meeting the extended hyperbola before then never arrives.
        var launched = new HyperbolicWorldline(new FourVector(0, 1 / a, 0, 0), Velocity.Rest, a * Vec3.UnitX) { StartHomeTime = 0 };
        LightConeEvent late = LightCone.Arrival(new FourVector(sent, 0, 0, 0), launched);
        Assert.Equal(expected >= 0 ? LightConeOutcome.Met : LightConeOutcome.BeforeWorldlineBegan, late.Outcome);
    }

    [Fact]
    public void Retarded_event_before_a_worldline_began_is_never()
    {
        var beacon = new InertialWorldline(new FourVector(100, 0, 0, 0), Velocity.Rest) { StartHomeTime = 100 };
        Assert.Equal(LightConeOutcome.BeforeWorldlineBegan, LightCone.Retarded(new FourVector(150, 60, 0, 0), beacon).Outcome);
        Assert.Equal(110, LightCone.Retarded(new FourVector(150, 40, 0, 0), beacon).Event.T, 12);
        Assert.Equal(LightConeOutcome.BeforeWorldlineBegan, LightCone.Retarded(new FourVector(150, 60, 0, 0), new Opaque(beacon)).Outcome);
    }

    [Fact]
    public void Retarded_event_on_an_orbit_lies_on_the_orbit_and_the_past_light_cone()
    {
        var planet = CircularWorldline.FromPeriod(new Vec3(0, 0, 0), 500, 3.15e7, Vec3.UnitZ, phase: 1);
        var observer = new FourVector(1e6, 2e4, -1e3, 300);
        LightConeEvent seen = LightCone.Retarded(observer, planet);
        Assert.True(seen.IsMet);
        FourVector gap = observer - seen.Event;
        // On the past light cone: t_o − t_e = |x_o − x_e| (definition), to far below a metre of light travel.
        Assert.True(Math.Abs(gap.T - gap.Space.Length) < 1e-9, $"residual {gap.T - gap.Space.Length:R} s");
        Assert.True((planet.EventAtHomeTime(seen.Event.T).Space - seen.Event.Space).Length == 0);
    }
}
